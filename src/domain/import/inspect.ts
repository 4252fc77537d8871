// The first look at a file, before the mapping step: its encoding and layout, the columns with their units, a
// preview, and a suggested mapping (from the header words, or a saved profile whose columns match).
import {
  headerSignature,
  MAPPING_FORMAT,
  suggestColumns,
  type ImportMapping,
  type Target,
} from './mapping.js';
import { detectNewline } from './row-tokenizer.js';
import { sniffLayout, type TableLayout } from './sniff.js';
import { binaryAt, ByteDecoder, type TextEncodingName } from './text-decoding.js';

export interface SavedProfile {
  readonly signature: string;
  readonly mapping: ImportMapping;
}

export type Inspection =
  | {
      readonly ok: true;
      readonly encoding: TextEncodingName;
      readonly bom: boolean;
      readonly layout: TableLayout;
      readonly signature: string;
      readonly suggested: ImportMapping;
      /** Whether the suggestion is a saved profile for these columns. */
      readonly fromProfile: boolean;
    }
  | { readonly ok: false; readonly message: string };

/** Inspects the head of a file (64 KiB is plenty); `whole` when the bytes are the entire file. */
export function inspectTable(
  head: Uint8Array,
  whole: boolean,
  options: { readonly mapping?: ImportMapping; readonly profiles?: readonly SavedProfile[] } = {},
): Inspection {
  const decoder = new ByteDecoder();
  let text = decoder.push(head);
  if (whole) text += decoder.end();
  if (text.trim() === '')
    return {
      ok: false,
      message: head.length === 0 ? 'The file is empty.' : 'The file holds only blank space.',
    };
  const bad = binaryAt(text);
  if (bad >= 0) {
    return {
      ok: false,
      message: `The file is not a text table: it holds binary data (a control character near character ${bad + 1}).`,
    };
  }
  const sample = text.length > 64 * 1024 ? text.slice(0, 64 * 1024) : text;
  const sniffed = sniffLayout(sample, detectNewline(text), whole && sample === text, options.mapping);
  if (!sniffed.ok) return sniffed;
  const layout = sniffed.layout;
  const signature = headerSignature(layout.columns.map((c) => c.name));
  const saved = layout.header ? options.profiles?.find((p) => p.signature === signature) : undefined;
  const detected = { delimiter: layout.delimiter, decimal: layout.decimal, header: layout.header };
  let suggested: ImportMapping;
  if (options.mapping) suggested = { ...options.mapping, ...detected };
  else if (saved) suggested = { ...saved.mapping, ...detected };
  else {
    const columns: Partial<Record<Target, number | string>> = {};
    for (const [t, i] of Object.entries(
      suggestColumns(layout.header ? layout.columns.map((c) => c.name) : []),
    )) {
      const col = layout.columns[i - 1];
      if (col) columns[t as Target] = col.name;
    }
    suggested = { format: MAPPING_FORMAT, ...detected, columns };
  }
  return {
    ok: true,
    encoding: decoder.encoding,
    bom: decoder.bom,
    layout,
    signature,
    suggested,
    fromProfile: !!saved,
  };
}
