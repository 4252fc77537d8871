// The parameter-table import, streamed: bytes in (any chunk size), hashed as they arrive, decoded at the byte
// boundary, sniffed from the first 64 KiB, tokenized by papaparse chunk by chunk and read row by row into readings
// or quarantine entries. Nothing is stored here: the caller shows the outcome and the user decides.
import { MAX_READINGS, type Reading } from '../model/seam-file.js';
import { compileMapping, type CompiledMapping } from './compile-mapping.js';
import { MAPPING_FORMAT, type ImportMapping } from './mapping.js';
import type { RowCells } from './row-cells.js';
import { RowReader, type ImportContext, type QuarantineCode, type QuarantinedRow } from './row-readings.js';
import { detectNewlineIn, RowTokenizer, UnclosedQuote } from './row-tokenizer.js';
import { sha256, type Hasher } from './sha256.js';
import { sniffLayout, type TableLayout } from './sniff.js';
import { binaryAtAll, ByteDecoder, type TextEncodingName } from './text-decoding.js';

/** Files above this size are refused before they are read: a seam holds at most 200,000 readings anyway. */
export const MAX_TABLE_BYTES = 64 * 1024 * 1024;
/** The readings one import may add: the seam file's own limit. */
export const MAX_IMPORT_READINGS = MAX_READINGS;
/** Quarantined rows kept with their reasons; beyond this only the counts per reason go on. */
export const MAX_QUARANTINE_KEPT = 10_000;
const SNIFF_BYTES = 64 * 1024;
/**
 * Chunks are decoded in pieces of at most this many bytes: the text of a whole megabyte chunk is a string placed in
 * fresh memory of its own, which cost more than decoding it; a piece this size is made where short-lived objects go.
 */
const PIECE_BYTES = 64 * 1024;

export interface Refusal {
  readonly message: string;
  readonly line?: number;
}

export interface FileFacts {
  readonly bytes: number;
  /** SHA-256 of the file's bytes as received, lower-case hex. */
  readonly sha256: string;
  readonly encoding: TextEncodingName;
  readonly bom: boolean;
}

export interface TableRead extends FileFacts {
  readonly kind: 'read';
  readonly layout: TableLayout;
  /** The mapping with what was detected filled in: saved as the source's profile. */
  readonly mapping: ImportMapping;
  readonly compiled: CompiledMapping;
  readonly dataRows: number;
  readonly readings: Reading[];
  readonly quarantine: QuarantinedRow[];
  readonly quarantinedRows: number;
  readonly quarantineByCode: Partial<Record<QuarantineCode, number>>;
}

export interface TableRefused extends Partial<FileFacts> {
  readonly kind: 'refused';
  readonly refusal: Refusal;
  readonly layout?: TableLayout;
}

export type TableOutcome = TableRead | TableRefused;

export interface TableImportOptions {
  /** The mapping; without one (or for what it leaves out) the layout is detected and columns are mapped by name. */
  readonly mapping?: ImportMapping;
  readonly context: ImportContext;
  readonly hasher?: Hasher;
  readonly maxBytes?: number;
  /** The file's size when known: a file over the limit is refused before a byte is read. */
  readonly size?: number;
}

export interface TableProgress {
  readonly bytes: number;
  readonly dataRows: number;
  readonly readings: number;
  readonly quarantined: number;
}

const mib = (n: number) => `${(n / 1024 / 1024).toFixed(1)} MiB`;

/** Streams one table through: `push` each chunk of bytes, then `finish`. After a refusal, further pushes are ignored. */
export class TableImport {
  private readonly hasher: Hasher;
  private readonly decoder = new ByteDecoder();
  private readonly maxBytes: number;
  private head: Uint8Array[] = [];
  private headBytes = 0;
  private bytes = 0;
  private refusal: Refusal | null = null;
  private layout: TableLayout | null = null;
  private mapping: ImportMapping | null = null;
  private compiled: CompiledMapping | null = null;
  private tokenizer: RowTokenizer | null = null;
  private reader: RowReader | null = null;
  private dataRows = 0;
  private readonly readings: Reading[] = [];
  private readonly quarantine: QuarantinedRow[] = [];
  private quarantined = 0;
  private readonly byCode: Partial<Record<QuarantineCode, number>> = {};
  private firstText = true;

  constructor(private readonly options: TableImportOptions) {
    this.hasher = options.hasher ?? sha256();
    this.maxBytes = options.maxBytes ?? MAX_TABLE_BYTES;
    if (options.context.importId.length > 40 || !options.context.importId) {
      throw new Error('importId must be 1 to 40 characters');
    }
    if (options.size !== undefined && options.size > this.maxBytes) this.refuse(this.tooBig(options.size));
  }

  get progress(): TableProgress {
    return {
      bytes: this.bytes,
      dataRows: this.dataRows,
      readings: this.readings.length,
      quarantined: this.quarantined,
    };
  }

  get refused(): boolean {
    return this.refusal !== null;
  }

  push(chunk: Uint8Array): void {
    if (this.refusal) return;
    this.bytes += chunk.length;
    if (this.bytes > this.maxBytes) {
      this.refuse(this.tooBig(this.bytes, true));
      return;
    }
    this.hasher.update(chunk);
    if (!this.layout) {
      this.head.push(chunk);
      this.headBytes += chunk.length;
      if (this.headBytes >= SNIFF_BYTES) this.start(false);
      return;
    }
    this.text(this.decode(chunk), false);
  }

  finish(): TableOutcome {
    if (!this.refusal && !this.layout) this.start(true);
    if (!this.refusal) this.text([this.decoder.end()], true);
    const facts = this.refusal && this.bytes > this.maxBytes ? { bytes: this.bytes } : this.facts();
    if (!this.refusal && this.layout && this.dataRows === 0) {
      this.refuse({ message: 'The file has a header but no data rows.' });
    }
    if (!this.refusal && this.readings.length === 0 && this.quarantined > 0) {
      const first = this.quarantine[0];
      this.refuse({
        message: `None of the ${this.dataRows} data rows could be read${first ? `; the first, on line ${first.line}, ${first.reason}` : ''}.`,
        ...(first ? { line: first.line } : {}),
      });
    }
    if (this.refusal || !this.layout || !this.mapping || !this.compiled) {
      return {
        kind: 'refused',
        refusal: this.refusal ?? { message: 'The file could not be read.' },
        ...facts,
        ...(this.layout ? { layout: this.layout } : {}),
      };
    }
    return {
      kind: 'read',
      ...(facts as FileFacts),
      layout: this.layout,
      mapping: this.mapping,
      compiled: this.compiled,
      dataRows: this.dataRows,
      readings: this.readings,
      quarantine: this.quarantine,
      quarantinedRows: this.quarantined,
      quarantineByCode: this.byCode,
    };
  }

  private facts(): FileFacts {
    return {
      bytes: this.bytes,
      sha256: this.hasher.digest(),
      encoding: this.decoder.encoding,
      bom: this.decoder.bom,
    };
  }

  private tooBig(size: number, streaming = false): Refusal {
    return {
      message: `The file is ${streaming ? 'larger than' : ''}${streaming ? ' ' : ''}${mib(size)}; at most ${mib(this.maxBytes)} is accepted (a seam holds at most ${MAX_IMPORT_READINGS.toLocaleString('en')} readings). Split the export by seam or by stretch.`,
    };
  }

  private refuse(r: Refusal): void {
    if (!this.refusal) this.refusal = r;
  }

  /** Decodes the buffered head, finds the layout and compiles the mapping, then reads the head's rows. */
  private start(final: boolean): void {
    const all = new Uint8Array(this.headBytes);
    let at = 0;
    for (const c of this.head) {
      all.set(c, at);
      at += c.length;
    }
    this.head = [];
    const texts = this.decode(all, all);
    if (final) texts.push(this.decoder.end());
    if (texts.every((t) => t.trim() === '')) {
      this.refuse({ message: this.bytes === 0 ? 'The file is empty.' : 'The file holds only blank space.' });
      return;
    }
    const bad = binaryAtAll(texts);
    if (bad >= 0) {
      this.refuse({
        message: `The file is not a text table: it holds binary data (a control character near character ${bad + 1}).`,
      });
      return;
    }
    const newline = detectNewlineIn(texts);
    // The layout is read from the first 64 KiB only; the rows themselves are read once, below.
    let sample = '';
    for (let i = 0; i < texts.length && sample.length < SNIFF_BYTES; i++) sample += texts[i];
    const whole = texts.reduce((n, t) => n + t.length, 0) <= SNIFF_BYTES;
    if (sample.length > SNIFF_BYTES) sample = sample.slice(0, SNIFF_BYTES);
    const sniffed = sniffLayout(sample, newline, final && whole, this.options.mapping);
    if (!sniffed.ok) {
      this.refuse({ message: sniffed.message });
      return;
    }
    const layout = sniffed.layout;
    const given = this.options.mapping;
    const mapping: ImportMapping = {
      ...(given ?? { format: MAPPING_FORMAT, columns: {} }),
      delimiter: layout.delimiter,
      decimal: layout.decimal,
      header: layout.header,
    };
    if (!given || Object.keys(given.columns).length === 0) {
      this.refuse({ message: 'No mapping was given: map the columns first (suggestMapping proposes one).' });
      this.layout = layout;
      return;
    }
    const compiled = compileMapping(mapping, layout, this.options.context.seam);
    this.layout = layout;
    if (!compiled.ok) {
      this.refuse({ message: compiled.message });
      return;
    }
    this.mapping = mapping;
    this.compiled = compiled.compiled;
    this.tokenizer = new RowTokenizer(layout.delimiter, newline, layout.decimal);
    this.reader = new RowReader(compiled.compiled, mapping, this.options.context);
    this.text(texts, final);
  }

  /** The chunk's text in pieces (see PIECE_BYTES); `head`, for the first chunk, decides the encoding. */
  private decode(bytes: Uint8Array, head?: Uint8Array): string[] {
    const texts: string[] = [];
    let at = 0;
    do {
      texts.push(this.decoder.push(bytes.subarray(at, at + PIECE_BYTES), head));
      at += PIECE_BYTES;
    } while (at < bytes.length);
    return texts;
  }

  /** Reads one chunk's text, given in pieces; the binary check looks at the chunk's text as a whole. */
  private text(texts: readonly string[], final: boolean): void {
    const tokenizer = this.tokenizer;
    const reader = this.reader;
    const layout = this.layout;
    if (!tokenizer || !reader || !layout || this.refusal) return;
    if (this.firstText) this.firstText = false;
    else {
      const bad = binaryAtAll(texts);
      if (bad >= 0) {
        this.refuse({
          message: `The file turns into binary data after ${mib(this.bytes)}: it is not a text table.`,
        });
        return;
      }
    }
    const start = layout.dataStartLine;
    const sink = (row: RowCells, line: number): void => {
      if (line < start || this.refusal) return;
      if (row.count === 1 && row.text(0).trim() === '') return;
      this.dataRows++;
      const out = reader.read(row, line, this.readings);
      if (out.ok) {
        if (this.readings.length > MAX_IMPORT_READINGS) {
          this.refuse({
            message: `The file makes more than ${MAX_IMPORT_READINGS.toLocaleString('en')} readings (the most one seam holds) by line ${line}. Split the export by seam or by stretch.`,
            line,
          });
        }
      } else {
        this.quarantined++;
        this.byCode[out.code] = (this.byCode[out.code] ?? 0) + 1;
        if (this.quarantine.length < MAX_QUARANTINE_KEPT)
          this.quarantine.push({ line, code: out.code, reason: out.reason });
      }
    };
    try {
      for (let i = 0; i < texts.length && !this.refusal; i++)
        tokenizer.feedCells(texts[i] as string, final && i === texts.length - 1, sink);
    } catch (e) {
      if (e instanceof UnclosedQuote)
        this.refuse({ message: `The file cannot be read: ${e.message}.`, line: e.line });
      else throw e;
    }
    if (tokenizer.pending > 8 * 1024 * 1024) {
      this.refuse({
        message:
          'The file cannot be read: a quoted field runs on for more than 8 MiB (an opening quote that is never closed).',
      });
    }
  }
}

/** Reads a whole table held in memory (tests, small files); the same path as streaming, in 1 MiB chunks. */
export function importTable(bytes: Uint8Array, options: TableImportOptions): TableOutcome {
  const t = new TableImport(options);
  for (let i = 0; i < bytes.length && !t.refused; i += 1 << 20) t.push(bytes.subarray(i, i + (1 << 20)));
  return t.finish();
}
