// One tokenized row, read cell by cell. Rows from papaparse arrive as string arrays; rows of unquoted text are
// kept as spans of the chunk, so a number cell is read in place and never becomes a string of its own.
import { plainNumberIn } from './cells.js';

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

  /** Splits source[from, to) at `delimiter`, as String.split would. */
  split(source: string, from: number, to: number, delimiter: string): void {
    this.source = source;
    let n = 0;
    let at = from;
    for (;;) {
      if (n === this.starts.length) this.grow();
      let d = source.indexOf(delimiter, at);
      if (d === -1 || d > to) d = to;
      this.starts[n] = at;
      this.ends[n] = d;
      n++;
      if (d === to) break;
      at = d + 1;
    }
    this.count = n;
  }

  text(i: number): string {
    return i < this.count ? this.source.substring(this.starts[i] as number, this.ends[i] as number) : '';
  }

  plainNumber(i: number, decimal: '.' | ','): number {
    if (i >= this.count) return NaN;
    return plainNumberIn(this.source, this.starts[i] as number, this.ends[i] as number, decimal);
  }

  private grow(): void {
    const starts = new Int32Array(this.starts.length * 2);
    const ends = new Int32Array(this.ends.length * 2);
    starts.set(this.starts);
    ends.set(this.ends);
    this.starts = starts;
    this.ends = ends;
  }
}
