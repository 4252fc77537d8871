// One tokenized row, read cell by cell. Rows from papaparse arrive as string arrays; rows of unquoted text are
// kept as spans of the chunk, so a number cell is read in place and never becomes a string of its own.
import { exactDecimal, plainNumberIn } from './cells.js';
import type { Newline } from './row-tokenizer.js';

export interface RowCells {
  readonly count: number;
  /** The cell's text ('' beyond the row's end). */
  text(i: number): string;
  /** The cell as a plain number (see plainNumber), or NaN when it needs readCell's full reading. */
  plainNumber(i: number, decimal: '.' | ','): number;
}

export class ArrayRow implements RowCells {
  cells: readonly string[] = [];

  get count(): number {
    return this.cells.length;
  }

  text(i: number): string {
    return this.cells[i] ?? '';
  }

  plainNumber(i: number, decimal: '.' | ','): number {
    const s = this.cells[i] ?? '';
    return plainNumberIn(s, 0, s.length, decimal);
  }
}

/** Cells as [start, end) offsets into one text; reused row after row. */
export class SpanRow implements RowCells {
  source = '';
  count = 0;
  private starts = new Int32Array(64);
  private ends = new Int32Array(64);
  /** plainNumber of each cell with the decimal mark `numbersFor`, read while the row was scanned. */
  private numbers = new Float64Array(64);
  private numbersFor: '.' | ',' | null = null;

  /**
   * Reads one row from `from` in a single pass over its characters: the cells split at the one-character
   * `delimiter` as String.split would, and each cell's plainNumber with `decimal` on the way, so the row is not
   * read twice.
   * Returns where the row's newline starts, or -1 when the text ends first (the cells then run to its end).
   */
  scan(source: string, from: number, delimiter: number, newline: Newline, decimal: '.' | ','): number {
    this.source = source;
    this.numbersFor = decimal;
    const mark = decimal === '.' ? 46 : 44;
    const crlf = newline === '\r\n';
    const brk = newline === '\n' ? 10 : 13;
    const n = source.length;
    let cell = 0;
    let start = from;
    // plainNumberIn's state for the cell being read (see cells.ts): sign, digits as one integer, decimals.
    let negative = false;
    let mantissa = 0;
    let digits = 0;
    let frac = -1;
    let plain = true;
    let end = -1;
    for (let i = from; i < n; i++) {
      const c = source.charCodeAt(i);
      if (c === delimiter || c === brk) {
        // A carriage return on its own is part of a cell when rows end in CRLF.
        if (c === brk && crlf && source.charCodeAt(i + 1) !== 10) {
          plain = false;
          continue;
        }
        if (cell === this.starts.length) this.grow();
        this.cell(cell++, start, i, plain, negative, mantissa, digits, frac);
        if (c === brk) {
          end = i;
          break;
        }
        start = i + 1;
        negative = false;
        mantissa = 0;
        digits = 0;
        frac = -1;
        plain = true;
      } else if (c >= 48 && c <= 57) {
        mantissa = mantissa * 10 + (c - 48);
        digits++;
        if (frac >= 0) frac++;
      } else if (c === mark && frac < 0) frac = 0;
      else if ((c === 45 || c === 43) && i === start) negative = c === 45;
      else plain = false;
    }
    if (end === -1) {
      if (cell === this.starts.length) this.grow();
      this.cell(cell++, start, n, plain, negative, mantissa, digits, frac);
    }
    this.count = cell;
    return end;
  }

  private cell(
    k: number,
    start: number,
    end: number,
    plain: boolean,
    negative: boolean,
    mantissa: number,
    digits: number,
    frac: number,
  ): void {
    this.starts[k] = start;
    this.ends[k] = end;
    // The same bounds as plainNumberIn: at most 17 characters and 15 digits, so the integer is exact.
    this.numbers[k] = plain && end - start <= 17 ? exactDecimal(negative, mantissa, digits, frac) : NaN;
  }

  text(i: number): string {
    return i < this.count ? this.source.substring(this.starts[i] as number, this.ends[i] as number) : '';
  }

  plainNumber(i: number, decimal: '.' | ','): number {
    if (i >= this.count) return NaN;
    if (decimal === this.numbersFor) return this.numbers[i] as number;
    return plainNumberIn(this.source, this.starts[i] as number, this.ends[i] as number, decimal);
  }

  private grow(): void {
    const starts = new Int32Array(this.starts.length * 2);
    const ends = new Int32Array(this.ends.length * 2);
    const numbers = new Float64Array(this.numbers.length * 2);
    starts.set(this.starts);
    ends.set(this.ends);
    numbers.set(this.numbers);
    this.starts = starts;
    this.ends = ends;
    this.numbers = numbers;
  }
}
