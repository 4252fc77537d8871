// The part of papaparse the import core uses: its low-level tokenizer, fed one text chunk at a time. Typed here
// (tsconfig.shared.json maps the module to this file) because the package's own typings pull in Node's stream
// types, which the pure core must not see.
export interface ParserConfig {
  readonly delimiter: string;
  readonly newline: '\n' | '\r';
  readonly quoteChar: string;
}
export interface ParserError {
  readonly type: string;
  readonly code: string;
  readonly message: string;
  readonly row?: number;
}
export interface ParserResult {
  readonly data: string[][];
  readonly errors: ParserError[];
  readonly meta: { readonly cursor: number };
}
export declare class Parser {
  constructor(config: ParserConfig);
  parse(input: string, baseIndex: number, ignoreLastRow: boolean): ParserResult;
}
declare const Papa: {
  readonly Parser: typeof Parser;
  parse(input: string, config?: object): { readonly data: unknown[]; readonly errors: ParserError[] };
};
export default Papa;
