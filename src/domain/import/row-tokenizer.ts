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
  return detectNewlineIn([text]);
}

/** detectNewline of the texts joined, without joining them. */
export function detectNewlineIn(texts: readonly string[]): Newline {
  let n = -1;
  let r = -1;
  let base = 0;
  for (const text of texts) {
    if (n === -1) {
      const k = text.indexOf('\n');
      if (k !== -1) n = base + k;
    }
    if (r === -1) {
      const k = text.indexOf('\r');
      if (k !== -1) r = base + k;
    }
    if (n !== -1 && r !== -1) break;
    base += text.length;
  }
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

  /** The decimal mark numbers are read with as rows are split (see SpanRow.scan). */
  constructor(
    delimiter: string,
    newline: Newline,
    private readonly decimal: '.' | ',' = '.',
  ) {
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
    const partial = this.partial;
    // The two parts are searched apart: a search in the joined string first copies it whole, a megabyte a chunk.
    if (this.delimiter.length !== 1 || text.indexOf('"') !== -1 || partial.indexOf('"') !== -1) {
      const row = this.arrayRow;
      this.feed(text, final, (cells, line) => {
        row.cells = cells;
        sink(row, line);
      });
      return;
    }
    // The row left from the last chunk is finished on a short string of its own, so the chunk is read as it came.
    let source = text;
    let from = 0;
    if (partial.length > 0) {
      const k = text.indexOf(this.newline);
      if (k === -1) source = partial + text;
      else {
        from = k + this.newline.length;
        this.rowsOf(partial + text.substring(0, from), 0, false, sink);
      }
    }
    // papaparse reads no rows at all from empty text, even the final chunk.
    const at = source.length > 0 ? this.rowsOf(source, from, final, sink) : 0;
    const rest = final ? '' : source.substring(at);
    this.base += partial.length + text.length - rest.length;
    this.partial = rest;
  }

  /** Hands over the rows of input from `from`; returns where the unfinished last row starts (read too if final). */
  private rowsOf(input: string, from: number, final: boolean, sink: CellsSink): number {
    const nl = this.newline;
    const row = this.spanRow;
    const delimiter = this.delimiter.charCodeAt(0);
    let at = from;
    for (;;) {
      const end = row.scan(input, at, delimiter, nl, this.decimal);
      if (end === -1) {
        if (final) sink(row, this.nextLine++);
        return at;
      }
      sink(row, this.nextLine++);
      at = end + nl.length;
    }
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
