// What the import worker exposes: reading a picked file in chunks, so the page stays responsive and a huge file is
// never held whole. Plain functions over plain data; the page-side type is `typeof importApi`. A File or Blob
// satisfies ByteSource, so this module needs no DOM types.
import type { Reading } from '../src/domain/index.js';
import {
  inspectTable,
  TableImport,
  type ImportContext,
  type ImportMapping,
  type Inspection,
  type QuarantinedRow,
  type SavedProfile,
} from '../src/domain/import/index.js';
import { ProfileImport, QUALITY_THRESHOLD } from '../src/domain/profile/index.js';
import { webCryptoHasher } from './web-crypto-hasher.js';

export interface ByteSource {
  readonly size: number;
  slice(start: number, end: number): { arrayBuffer(): Promise<ArrayBuffer> };
}

export interface ImportProgress {
  readonly bytes: number;
  readonly size: number;
  /** Data rows or slices read so far. */
  readonly items: number;
}

export type ReadOutcome =
  | { readonly kind: 'refused'; readonly message: string; readonly line?: number; readonly bytes: number }
  | {
      readonly kind: 'read';
      readonly bytes: number;
      readonly sha256: string;
      readonly encoding: string;
      readonly items: number;
      readonly readings: Reading[];
      readonly quarantined: number;
      readonly quarantine: QuarantinedRow[];
      readonly byCode: Record<string, number>;
      readonly mapping?: ImportMapping;
    };

const CHUNK = 1 << 20;

async function pump(
  file: ByteSource,
  push: (b: Uint8Array) => void,
  stop: () => boolean,
  progress: (bytes: number) => void,
): Promise<void> {
  for (let at = 0; at < file.size && !stop(); at += CHUNK) {
    const end = Math.min(file.size, at + CHUNK);
    push(new Uint8Array(await file.slice(at, end).arrayBuffer()));
    progress(end);
  }
}

export const importApi = {
  async inspect(file: ByteSource, profiles: readonly SavedProfile[]): Promise<Inspection> {
    const head = new Uint8Array(await file.slice(0, 64 * 1024).arrayBuffer());
    return inspectTable(head, file.size <= 64 * 1024, { profiles });
  },

  async readTable(
    file: ByteSource,
    mapping: ImportMapping,
    context: ImportContext,
    onProgress?: (p: ImportProgress) => void,
  ): Promise<ReadOutcome> {
    // Hashed natively where it can be; otherwise the import's own streaming hasher.
    const native = webCryptoHasher(file);
    const t = new TableImport({
      mapping,
      context,
      size: file.size,
      ...(native ? { hasher: native.hasher } : {}),
    });
    await pump(
      file,
      (b) => t.push(b),
      () => t.refused,
      (bytes) => onProgress?.({ bytes, size: file.size, items: t.progress.dataRows }),
    );
    if (native) await native.ready;
    const o = t.finish();
    if (o.kind === 'refused') {
      return {
        kind: 'refused',
        message: o.refusal.message,
        ...(o.refusal.line ? { line: o.refusal.line } : {}),
        bytes: o.bytes ?? file.size,
      };
    }
    return {
      kind: 'read',
      bytes: o.bytes,
      sha256: o.sha256,
      encoding: o.encoding,
      items: o.dataRows,
      readings: o.readings,
      quarantined: o.quarantinedRows,
      quarantine: o.quarantine.slice(0, 500),
      byCode: o.quarantineByCode,
      mapping: o.mapping,
    };
  },

  async readProfiles(
    file: ByteSource,
    context: ImportContext,
    position: number | undefined,
    onProgress?: (p: ImportProgress) => void,
  ): Promise<ReadOutcome> {
    let slices = 0;
    const p = new ProfileImport({
      context,
      keepSlices: false,
      onSlice: () => void slices++,
      ...(position !== undefined ? { position } : {}),
    });
    await pump(
      file,
      (b) => p.push(b),
      () => p.refused,
      (bytes) => onProgress?.({ bytes, size: file.size, items: slices }),
    );
    const o = p.finish();
    if (o.kind === 'refused') return { kind: 'refused', message: o.refusal.message, bytes: o.bytes };
    return {
      kind: 'read',
      bytes: o.bytes,
      sha256: o.sha256,
      encoding: o.encoding,
      items: o.sliceCount,
      readings: o.readings,
      quarantined: o.flaggedCount + o.quarantine.filter((q) => q.code === 'notNumber').length,
      quarantine: o.quarantine.slice(0, 500),
      byCode: { flagged: o.flaggedCount },
    };
  },

  qualityThreshold: (): number => QUALITY_THRESHOLD,
};

export type ImportApi = typeof importApi;
