export * from './mapping.js';
export * from './units.js';
export * from './sha256.js';
export { detectEncoding, type TextEncodingName } from './text-decoding.js';
export type { ColumnInfo, TableLayout, Delimiter } from './sniff.js';
export type { CompiledMapping, CompiledValue } from './compile-mapping.js';
export type { ImportContext, QuarantinedRow, QuarantineCode } from './row-readings.js';
export * from './table-import.js';
export * from './inspect.js';
