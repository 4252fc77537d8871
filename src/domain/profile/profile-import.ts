// Raw profile files: x,z points, one profile per file or many with a slice column (its value is the position along
// the seam). Streamed like parameter tables; each slice is extracted as soon as its last point has been read, so
// memory holds one slice at a time. Extracted slices become readings unless flagged; flagged slices wait for the
// user's decision with their reasons, as quarantined rows do.
import { PARAMETERS, type ParameterName } from '../model/parameters.js';
import type { Reading, Values } from '../model/seam-file.js';
import { plainNumber, readCell } from '../import/cells.js';
import type { ImportContext, QuarantinedRow } from '../import/row-readings.js';
import { detectNewline, RowTokenizer, UnclosedQuote } from '../import/row-tokenizer.js';
import { sha256, type Hasher } from '../import/sha256.js';
import { sniffLayout, type TableLayout } from '../import/sniff.js';
import { binaryAt, ByteDecoder, type TextEncodingName } from '../import/text-decoding.js';
import { isAngleUnit, UNIT_FACTOR, type LengthUnit } from '../import/units.js';
import { extractSlice, RADIUS_QUALITY, type SliceGeometry } from './extract.js';

export const MAX_PROFILE_BYTES = 1024 * 1024 * 1024;
export const MAX_SLICES = 100_000;
const SNIFF_BYTES = 64 * 1024;

export interface SliceResult {
  /** Position along the seam, mm (from the slice column, or the option for a single profile). */
  readonly position: number;
  readonly line: number;
  readonly geometry: SliceGeometry;
  /** The readings this slice makes; empty when flagged or out of the seam. */
  readonly readings: readonly Reading[];
}

export interface ProfileOptions {
  readonly context: ImportContext;
  /** Position of a single profile (a file without a slice column), mm. */
  readonly position?: number;
  readonly units?: LengthUnit;
  readonly hasher?: Hasher;
  readonly maxBytes?: number;
  /** Keep each slice's geometry in the outcome (true) or only hand it to `onSlice`. */
  readonly keepSlices?: boolean;
  onSlice?(slice: SliceResult): void;
}

export type ProfileOutcome =
  | {
      readonly kind: 'read';
      readonly bytes: number;
      readonly sha256: string;
      readonly encoding: TextEncodingName;
      readonly layout: TableLayout;
      readonly slices: SliceResult[];
      readonly sliceCount: number;
      readonly flaggedCount: number;
      readonly readings: Reading[];
      readonly quarantine: QuarantinedRow[];
    }
  | {
      readonly kind: 'refused';
      readonly refusal: { readonly message: string; readonly line?: number };
      readonly bytes: number;
    };

const X_NAME = /^x\b|^x_|across/i;
const Z_NAME = /^z\b|^z_|height|elevation/i;
const SLICE_NAME = /^(slice|profile|y|pos|position|s|station)(\b|_)/i;

class Growable {
  data = new Float64Array(1024);
  n = 0;
  push(v: number): void {
    if (this.n === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.n++] = v;
  }
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;
const r2 = (v: number) => Math.round(v * 100) / 100;

function inRange(p: ParameterName, v: number): boolean {
  const s = PARAMETERS[p];
  return (s.minExclusive ? v > s.min : v >= s.min) && v <= s.max;
}

/** The readings one extracted slice makes: plate 1's toe with the cross-section values, and plate 2's toe. */
export function sliceReadings(
  g: SliceGeometry,
  position: number,
  line: number,
  ctx: ImportContext,
): Reading[] {
  if (!g.toes || g.flagged) return [];
  const base = {
    round: ctx.round ?? 1,
    position,
    sampling: 'atPitch' as const,
    instrument: { id: 'profile-scanner', kind: 'scanner' as const },
    source: { kind: 'import' as const, importId: ctx.importId },
    recordedAt: ctx.recordedAt,
    ...(ctx.seam ? { seamId: ctx.seam.id } : {}),
    ...(ctx.examiner ? { examiner: ctx.examiner } : {}),
    ...(ctx.device ? { device: ctx.device } : {}),
  };
  const out: Reading[] = [];
  g.toes.forEach((t, i) => {
    const v: { -readonly [K in keyof Values]: Values[K] } = {};
    const put = (p: ParameterName, x: number | null, round: (n: number) => number) => {
      if (x === null || !Number.isFinite(x)) return;
      const y = round(x);
      if (inRange(p, y)) v[p] = y;
    };
    put('toeAngle', t.toeAngle, r2);
    if (g.quality >= RADIUS_QUALITY) put('toeRadius', t.toeRadius, r3);
    put('undercutDepth', t.undercutDepth, r3);
    if (i === 0) {
      put('reinforcementHeight', g.reinforcementHeight, r3);
      put('reinforcementWidth', g.reinforcementWidth, r3);
      if (v.reinforcementWidth === undefined) delete v.reinforcementHeight;
      put('linearMisalignment', g.linearMisalignment, r3);
      put('angularMisalignment', g.angularMisalignment, r2);
    }
    if (!Object.keys(v).length) return;
    out.push({
      ...base,
      id: `${ctx.importId}-${line}${i === 0 ? 'a' : 'b'}`,
      toe: { plate: i === 0 ? 1 : 2, side: 'face' },
      values: v,
      ...(v.linearMisalignment !== undefined ? { misalignmentBasis: 'faceSurface' as const } : {}),
    });
  });
  return out;
}

export class ProfileImport {
  private readonly hasher: Hasher;
  private readonly decoder = new ByteDecoder();
  private head: Uint8Array[] = [];
  private headBytes = 0;
  private bytes = 0;
  private refusal: { message: string; line?: number } | null = null;
  private layout: TableLayout | null = null;
  private tokenizer: RowTokenizer | null = null;
  private fast = false;
  private fastLine = 1;
  private rest = '';
  private cols: { x: number; z: number; slice: number; xf: number; zf: number; sf: number } | null = null;
  private decimal: '.' | ',' = '.';
  private key: string | null = null;
  private keyPos = 0;
  private keyLine = 0;
  private readonly px = new Growable();
  private readonly pz = new Growable();
  private readonly slices: SliceResult[] = [];
  private sliceCount = 0;
  private flagged = 0;
  private readonly readings: Reading[] = [];
  private readonly quarantine: QuarantinedRow[] = [];

  constructor(private readonly options: ProfileOptions) {
    this.hasher = options.hasher ?? sha256();
  }

  get refused(): boolean {
    return this.refusal !== null;
  }

  push(chunk: Uint8Array): void {
    if (this.refusal) return;
    this.bytes += chunk.length;
    if (this.bytes > (this.options.maxBytes ?? MAX_PROFILE_BYTES)) {
      this.refusal = {
        message: `The file is larger than ${((this.options.maxBytes ?? MAX_PROFILE_BYTES) / 1024 / 1024).toFixed(0)} MiB, the most a profile file may hold.`,
      };
      return;
    }
    this.hasher.update(chunk);
    if (!this.layout) {
      this.head.push(chunk);
      this.headBytes += chunk.length;
      if (this.headBytes >= SNIFF_BYTES) this.start(false);
      return;
    }
    this.text(this.decoder.push(chunk), false);
  }

  finish(): ProfileOutcome {
    if (!this.refusal && !this.layout) this.start(true);
    if (!this.refusal) this.text(this.decoder.end(), true);
    if (!this.refusal) this.closeSlice();
    if (!this.refusal && this.sliceCount === 0)
      this.refusal = { message: 'The file holds no profile points.' };
    if (this.refusal || !this.layout)
      return {
        kind: 'refused',
        refusal: this.refusal ?? { message: 'The file could not be read.' },
        bytes: this.bytes,
      };
    return {
      kind: 'read',
      bytes: this.bytes,
      sha256: this.hasher.digest(),
      encoding: this.decoder.encoding,
      layout: this.layout,
      slices: this.slices,
      sliceCount: this.sliceCount,
      flaggedCount: this.flagged,
      readings: this.readings,
      quarantine: this.quarantine,
    };
  }

  private start(final: boolean): void {
    const all = new Uint8Array(this.headBytes);
    let at = 0;
    for (const c of this.head) {
      all.set(c, at);
      at += c.length;
    }
    this.head = [];
    let text = this.decoder.push(all);
    if (final) text += this.decoder.end();
    if (text.trim() === '') {
      this.refusal = { message: 'The file is empty.' };
      return;
    }
    if (binaryAt(text) >= 0) {
      this.refusal = { message: 'The file is not a text table: it holds binary data.' };
      return;
    }
    const newline = detectNewline(text);
    // The layout is read from the first 64 KiB only; the rows themselves are read once, below.
    const sample = text.length > SNIFF_BYTES ? text.slice(0, SNIFF_BYTES) : text;
    const sniffed = sniffLayout(sample, newline, final && sample === text);
    if (!sniffed.ok) {
      this.refusal = { message: sniffed.message };
      return;
    }
    const layout = sniffed.layout;
    const names = layout.columns.map((c) => c.name);
    let x = -1,
      z = -1,
      slice = -1;
    if (layout.header) {
      x = names.findIndex((n) => X_NAME.test(n.trim()));
      z = names.findIndex((n) => Z_NAME.test(n.trim()));
      slice = names.findIndex((n, i) => i !== x && i !== z && SLICE_NAME.test(n.trim()));
    } else if (names.length === 2) [x, z] = [0, 1];
    else if (names.length === 3) [slice, x, z] = [0, 1, 2];
    if (x < 0 || z < 0) {
      this.refusal = {
        message: `No x and z columns found (columns: ${names.map((n) => `"${n}"`).join(', ')}): name them x and z, or give two columns x,z or three columns slice,x,z without a header.`,
      };
      return;
    }
    if (slice < 0 && this.options.position === undefined && layout.columns.length > 2) slice = -1;
    const unit = (i: number) => {
      const u = layout.columns[i]?.unit ?? this.options.units ?? 'mm';
      return isAngleUnit(u) ? 1 : UNIT_FACTOR[u];
    };
    this.cols = { x, z, slice, xf: unit(x), zf: unit(z), sf: slice >= 0 ? unit(slice) : 1 };
    this.decimal = layout.decimal;
    this.layout = layout;
    this.tokenizer = new RowTokenizer(layout.delimiter, newline);
    this.fast = newline !== '\r' && text.indexOf('"') === -1;
    this.text(text, final);
  }

  private text(text: string, final: boolean): void {
    const t = this.tokenizer;
    const c = this.cols;
    const layout = this.layout;
    if (!c || !layout || this.refusal) return;
    if (this.fast) {
      this.fastText(text, final, c, layout.dataStartLine);
      return;
    }
    if (!t) return;
    try {
      t.feed(text, final, (cells, line) => {
        if (line < layout.dataStartLine || this.refusal) return;
        if (cells.length === 1 && (cells[0] as string).trim() === '') return;
        this.point(
          cells[c.x] ?? '',
          cells[c.z] ?? '',
          c.slice >= 0 ? (cells[c.slice] ?? '').trim() : '',
          line,
        );
      });
    } catch (e) {
      if (e instanceof UnclosedQuote)
        this.refusal = { message: `The file cannot be read: ${e.message}.`, line: e.line };
      else throw e;
    }
  }

  /**
   * Profile files are millions of short number rows: without quotes in the file's head they are cut at line
   * breaks and delimiters here, taking only the columns used, instead of a cell array per point. A quote turning
   * up later makes that point unreadable (set aside with its line), never a silent misread.
   */
  private fastText(
    text: string,
    final: boolean,
    c: NonNullable<ProfileImport['cols']>,
    dataStart: number,
  ): void {
    const s = this.rest + text;
    const n = s.length;
    const delim = this.layout?.delimiter ?? ',';
    const last = Math.max(c.x, c.z, c.slice);
    let pos = 0;
    while (pos < n) {
      let nl = s.indexOf('\n', pos);
      if (nl === -1) {
        if (!final) break;
        nl = n;
      }
      let end = nl;
      if (end > pos && s.charCodeAt(end - 1) === 13) end--;
      const line = this.fastLine++;
      if (line >= dataStart && end > pos) {
        let xr = '';
        let zr = '';
        let key = '';
        let a = pos;
        for (let f = 0; f <= last; f++) {
          let b = s.indexOf(delim, a);
          if (b === -1 || b > end) b = end;
          if (f === c.x) xr = s.substring(a, b);
          else if (f === c.z) zr = s.substring(a, b);
          else if (f === c.slice) key = s.substring(a, b).trim();
          if (b === end) break;
          a = b + 1;
        }
        this.point(xr, zr, key, line);
        if (this.refusal) return;
      }
      pos = nl + 1;
    }
    this.rest = final || pos >= n ? '' : s.substring(pos);
  }

  private point(xr: string, zr: string, key: string, line: number): void {
    const c = this.cols;
    if (!c) return;
    let xv = plainNumber(xr, this.decimal);
    let zv = plainNumber(zr, this.decimal);
    if (xv !== xv) {
      const cell = readCell(xr, this.decimal);
      xv = cell.kind === 'number' ? cell.value : NaN;
    }
    if (zv !== zv) {
      const cell = readCell(zr, this.decimal);
      zv = cell.kind === 'number' ? cell.value : NaN;
    }
    if (xv !== xv || zv !== zv) {
      const bad = xv !== xv ? xr : zr;
      this.quarantine.push({
        line,
        code: 'notNumber',
        reason: `point "${bad.trim().slice(0, 40)}" is not a number`,
      });
      return;
    }
    if (key !== this.key) {
      this.closeSlice();
      this.key = key;
      this.keyLine = line;
      const s = readCell(key, this.decimal);
      this.keyPos =
        c.slice >= 0 ? (s.kind === 'number' ? s.value * c.sf : NaN) : (this.options.position ?? 0);
    }
    this.px.push(xv * c.xf);
    this.pz.push(zv * c.zf);
  }

  private closeSlice(): void {
    const n = this.px.n;
    if (this.key === null || n === 0) return;
    this.sliceCount++;
    if (this.sliceCount > MAX_SLICES) {
      this.refusal = { message: `The file holds more than ${MAX_SLICES} slices.` };
      return;
    }
    let x = this.px.data.subarray(0, n);
    let z = this.pz.data.subarray(0, n);
    let ascending = true;
    for (let i = 1; i < n; i++) {
      if ((x[i] as number) < (x[i - 1] as number)) ascending = false;
    }
    if (!ascending) {
      const order = Array.from({ length: n }, (_, i) => i).sort(
        (a, b) => (x[a] as number) - (x[b] as number),
      );
      x = Float64Array.from(order, (i) => this.px.data[i] as number);
      z = Float64Array.from(order, (i) => this.pz.data[i] as number);
    }
    const geometry = extractSlice(x, z, n);
    const position = this.keyPos;
    const seamLength = this.options.context.seam?.length;
    let readings: Reading[] = [];
    let problems = geometry.problems;
    if (!(position >= 0) || (seamLength !== undefined && position > seamLength)) {
      problems = [...problems, `slice position ${this.key} is not a position on the seam`];
    } else readings = sliceReadings(geometry, position, this.keyLine, this.options.context);
    const flagged = geometry.flagged || readings.length === 0;
    if (flagged) {
      this.flagged++;
      this.quarantine.push({
        line: this.keyLine,
        code: 'range',
        reason: `slice at ${this.key || position}: ${problems.join('; ') || 'no value could be extracted'}`,
      });
    }
    for (const r of readings) this.readings.push(r);
    const result: SliceResult = {
      position,
      line: this.keyLine,
      geometry: { ...geometry, flagged, problems },
      readings,
    };
    if (this.options.keepSlices !== false) this.slices.push(result);
    this.options.onSlice?.(result);
    this.px.n = 0;
    this.pz.n = 0;
  }
}

/** Reads a whole profile file held in memory. */
export function importProfiles(bytes: Uint8Array, options: ProfileOptions): ProfileOutcome {
  const p = new ProfileImport(options);
  for (let i = 0; i < bytes.length && !p.refused; i += 1 << 20) p.push(bytes.subarray(i, i + (1 << 20)));
  return p.finish();
}
