import { toJsonSchema } from '@valibot/to-json-schema';
import { limitsFileSchema, seamFileSchema } from '../domain/index.js';

const SCHEMAS = { seam: seamFileSchema, limits: limitsFileSchema } as const;
export type SchemaName = keyof typeof SCHEMAS;
export const SCHEMA_NAMES = Object.keys(SCHEMAS) as SchemaName[];

/**
 * The JSON Schema of a file format, generated from the validator itself so the two cannot drift. "finite" has no
 * JSON Schema form and needs none: JSON cannot hold NaN or Infinity.
 */
export function jsonSchemaOf(name: SchemaName): string {
  const schema = toJsonSchema(SCHEMAS[name], { errorMode: 'ignore' });
  const id = name === 'seam' ? 'seam-file.schema.json' : 'limits-file.schema.json';
  return JSON.stringify({ $id: `https://beadbook.invalid/schemas/${id}`, ...schema }, null, 2);
}
