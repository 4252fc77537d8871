// Text chunks in, rows out, each with the line it starts on. papaparse's tokenizer does the quoting; the chunk
// seams are handled here the way its own streamers do (the unfinished last row waits for the next chunk).
import Papa, { type Parser } from 'papaparse';
import { ArrayRow, SpanRow, type RowCells } from './row-cells.js';

export type Newline = '\n' | '\r\n' | '\r';

export interface RowSink {
  (cells: string[], line: number): void;
}

export interface CellsSink {
  (row: RowCells, line: number): void;
}

/** Where a quoted field is never closed: the rest of the file would be read as one field. */
export class UnclosedQuote extends Error {
  constructor(readonly line: number) {
    super(
      `an opening quote on line ${line} is never closed, so the rest of the file would be read as one field`,
    );
  }
}

export function detectNewline(text: string): Newline {
  const n = text.indexOf('\n');
  const r = text.indexOf('\r');
  if (r !== -1 && (n === -1 || r < n - 1)) return '\r';
  if (r !== -1 && n === r + 1) return '\r\n';
  return '\n';
}

export class RowTokenizer {
  private readonly parser: Parser;
  private readonly breakChar: string;
  private readonly delimiter: string;
  private readonly newline: Newline;
  private readonly arrayRow = new ArrayRow();
  private readonly spanRow = new SpanRow();
  private partial = '';
  private base = 0;
  private nextLine = 1;

  constructor(delimiter: string, newline: Newline) {
    // papaparse types its `newline` option narrowly; '\r\n' is one of the values it accepts.
    this.parser = new Papa.Parser({ delimiter, newline: newline as '\n', quoteChar: '"' });
    this.breakChar = newline === '\r' ? '\r' : '\n';
    this.delimiter = delimiter;
    this.newline = newline;
  }

  /**
   * As feed, but each row is handed over as cells to read in place (the row object is reused: read it before the
   * sink returns). Text without a quote is split here exactly as papaparse's own fast mode splits it (rows at the
   * newline, cells at the delimiter) without a string per cell; text with a quote goes through papaparse.
   */
  feedCells(text: string, final: boolean, sink: CellsSink): void {
    const input = this.partial + text;
    if (this.delimiter.length !== 1 || input.indexOf('"') !== -1) {
      const row = this.arrayRow;
      this.feed(text, final, (cells, line) => {
        row.cells = cells;
        sink(row, line);
      });
      return;
    }
    const nl = this.newline;
    const row = this.spanRow;
    let at = 0;
    // papaparse reads no rows at all from empty text, even the final chunk.
    if (input.length > 0) {
      for (;;) {
        const end = input.indexOf(nl, at);
        if (end === -1) {
          if (final) {
            row.split(input, at, input.length, this.delimiter);
            sink(row, this.nextLine++);
          }
          break;
        }
        row.split(input, at, end, this.delimiter);
        sink(row, this.nextLine++);
        at = end + nl.length;
      }
    }
    if (final) {
      this.partial = '';
      return;
    }
    this.partial = input.substring(at);
    this.base += at;
  }

  /** Tokenizes the next chunk; with `final`, also the last row. Throws UnclosedQuote on an unterminated quote. */
  feed(text: string, final: boolean, sink: RowSink): void {
    const input = this.partial + text;
    const quoted = input.indexOf('"') !== -1;
    const result = this.parser.parse(input, this.base, !final);
    const missing = result.errors.find((e) => e.code === 'MissingQuotes');
    const rows = result.data;
    for (let i = 0; i < rows.length; i++) {
      const cells = rows[i] as string[];
      const line = this.nextLine;
      let breaks = 0;
      if (quoted) for (const c of cells) breaks += countOf(c, this.breakChar);
      this.nextLine = line + 1 + breaks;
      if (missing && missing.row === i) throw new UnclosedQuote(line);
      sink(cells, line);
    }
    if (final) {
      this.partial = '';
      return;
    }
    const consumed = result.meta.cursor - this.base;
    this.partial = input.substring(consumed);
    this.base = result.meta.cursor;
  }

  /** Text held back waiting for the end of its row (an unclosed quote makes this grow). */
  get pending(): number {
    return this.partial.length;
  }
}

function countOf(s: string, ch: string): number {
  let n = 0;
  for (let i = s.indexOf(ch); i !== -1; i = s.indexOf(ch, i + 1)) n++;
  return n;
}
