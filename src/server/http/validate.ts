import * as v from 'valibot';
import { toProblems } from '../../domain/model/schema-kit.js';
import { HttpError } from './errors.js';

/** Parses a request body with a schema; a 400 names each faulty field. */
export function parseInput<S extends v.GenericSchema>(schema: S, input: unknown): v.InferOutput<S> {
  const parsed = v.safeParse(schema, input, { abortPipeEarly: true });
  if (!parsed.success) {
    const problems = toProblems(parsed.issues).slice(0, 10);
    throw new HttpError(400, 'invalid', problems.map((p) => `${p.path}: ${p.message}`).join('; '));
  }
  return parsed.output;
}
