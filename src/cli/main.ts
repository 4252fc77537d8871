#!/usr/bin/env node
import { parseArgs } from 'node:util';
import { gradeCommand, InputError } from './grade-command.js';
import { importCommand, profileCommand, Refused } from './import-command.js';
import { jsonSchemaOf, SCHEMA_NAMES, type SchemaName } from './schema-command.js';

const isSchemaName = (x: string | undefined): x is SchemaName => SCHEMA_NAMES.includes(x as SchemaName);

const USAGE = `Usage:
  beadbook grade FILE [--json] [--limits LIMITS.json]
      Grade a seam file (format: docs/seam-file.md) to ISO 5817 quality levels.
      --json     print the full result as JSON
      --limits   replace built-in limit rows with your organisation's verified table (docs/limits-file.md)
  beadbook import FILE [--mapping MAPPING.json] [--seam SEAM.json] [--json]
      Read a scanner's parameter table (CSV/TSV/semicolons; docs/import.md): the readings it would import, the
      quarantined rows with line numbers and reasons, or why the file is refused (exit 2). Without --mapping the
      columns are mapped by their header words. With --seam, rows are checked against that seam and graded.
  beadbook profile FILE [--position MM] [--seam SEAM.json] [--json]
      Extract weld geometry from raw x,z profiles (one per file, or many with a slice column): per slice the
      flank and toe angles, toe radius, height, width, undercut, misalignment and fit quality.
  beadbook schema seam|limits
      Print the JSON Schema of the seam file or the verified limit table.
  beadbook --help

Exit codes: 0 graded or read (whatever the level), 2 invalid input or a refused file, 1 unexpected failure.`;

async function main(argv: string[]): Promise<number> {
  const [command, ...rest] = argv;
  if (!command) {
    process.stderr.write(`${USAGE}\n`);
    return 2;
  }
  if (command === '--help' || command === '-h' || command === 'help') {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  if (command === 'schema') {
    const [name, ...extra] = rest;
    if (!isSchemaName(name) || extra.length) {
      throw new InputError(`schema takes one of: ${SCHEMA_NAMES.join(', ')}\n\n${USAGE}`);
    }
    process.stdout.write(`${jsonSchemaOf(name)}\n`);
    return 0;
  }
  if (command === 'import' || command === 'profile') return importOrProfile(command, rest);
  if (command !== 'grade') throw new InputError(`unknown command "${command}"\n\n${USAGE}`);
  let parsed;
  try {
    parsed = parseArgs({
      args: rest,
      allowPositionals: true,
      options: { json: { type: 'boolean', default: false }, limits: { type: 'string' } },
    });
  } catch (e) {
    throw new InputError(`${(e as Error).message}\n\n${USAGE}`);
  }
  const [file, ...extra] = parsed.positionals;
  if (!file || extra.length) throw new InputError(`grade takes exactly one seam file\n\n${USAGE}`);
  const out = await gradeCommand({ file, json: parsed.values.json ?? false, limits: parsed.values.limits });
  process.stdout.write(`${out}\n`);
  return 0;
}

async function importOrProfile(command: 'import' | 'profile', rest: string[]): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args: rest,
      allowPositionals: true,
      options: {
        json: { type: 'boolean', default: false },
        mapping: { type: 'string' },
        seam: { type: 'string' },
        position: { type: 'string' },
      },
    });
  } catch (e) {
    throw new InputError(`${(e as Error).message}\n\n${USAGE}`);
  }
  const [file, ...extra] = parsed.positionals;
  if (!file || extra.length) throw new InputError(`${command} takes exactly one file\n\n${USAGE}`);
  const { json = false, mapping, seam, position } = parsed.values;
  try {
    let out: string;
    if (command === 'import') {
      if (position !== undefined) throw new InputError('--position belongs to the profile command');
      out = await importCommand({ file, json, mapping, seam });
    } else {
      if (mapping !== undefined) throw new InputError('--mapping belongs to the import command');
      const at = position === undefined ? undefined : Number(position);
      if (at !== undefined && !(at >= 0))
        throw new InputError(`--position must be a length in mm, 0 or more; got "${position}"`);
      out = await profileCommand({ file, json, seam, position: at });
    }
    process.stdout.write(`${out}\n`);
    return 0;
  } catch (e) {
    if (!(e instanceof Refused)) throw e;
    process.stdout.write(`${e.output}\n`);
    return 2;
  }
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    if (e instanceof InputError) {
      process.stderr.write(`beadbook: ${e.message}\n`);
      process.exitCode = 2;
    } else {
      process.stderr.write(`beadbook: unexpected failure: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    }
  },
);
