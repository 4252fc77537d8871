// `beadbook import` and `beadbook profile`: the tablet's import readers on a QA desk. The file is streamed in
// chunks (never held whole) and hashed with node:crypto as it goes.
import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { readFile, stat } from 'node:fs/promises';
import {
  BUILT_IN_CRITERIA,
  describeProblems,
  gradeSeam,
  parseSeamFile,
  type Reading,
  type SeamFile,
} from '../domain/index.js';
import {
  inspectTable,
  MAX_TABLE_BYTES,
  parseMapping,
  TableImport,
  type ImportContext,
  type ImportMapping,
  type TableOutcome,
} from '../domain/import/index.js';
import {
  MAX_PROFILE_BYTES,
  ProfileImport,
  QUALITY_THRESHOLD,
  type ProfileOutcome,
} from '../domain/profile/index.js';
import { InputError } from './grade-command.js';
import { nodeHasher } from './node-hasher.js';

/** Exit code 2 with a printed outcome: the file was refused (the JSON still says why). */
export class Refused extends Error {
  constructor(readonly output: string) {
    super('refused');
  }
}

async function fileSize(path: string, what: string): Promise<number> {
  try {
    const info = await stat(path);
    if (!info.isFile()) throw new InputError(`${what} "${path}" is not a file`);
    return info.size;
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(`${what} "${path}" cannot be read: no such file, or no permission`);
  }
}

async function stream(path: string, push: (b: Uint8Array) => void, stop: () => boolean): Promise<void> {
  const s = createReadStream(path, { highWaterMark: 1 << 20 });
  for await (const chunk of s) {
    push(chunk as Buffer);
    if (stop()) {
      s.destroy();
      break;
    }
  }
}

async function readJsonFile(path: string, what: string): Promise<unknown> {
  await fileSize(path, what);
  try {
    return JSON.parse((await readFile(path, 'utf8')).replace(/^\uFEFF/, '')) as unknown;
  } catch (e) {
    throw new InputError(`${what} "${path}" is not valid JSON: ${(e as Error).message}`);
  }
}

async function seamOf(path: string | undefined): Promise<SeamFile | undefined> {
  if (!path) return undefined;
  const parsed = parseSeamFile(await readJsonFile(path, 'Seam file'), { allowNoReadings: true });
  if (!parsed.ok)
    throw new InputError(`Seam file "${path}" is not valid:\n${describeProblems(parsed.problems)}`);
  return parsed.value;
}

function contextFor(seamFile: SeamFile | undefined): ImportContext {
  const lastRound = seamFile?.rounds.reduce((m, r) => Math.max(m, r.number), 1) ?? 1;
  return {
    importId: randomUUID(),
    recordedAt: new Date().toISOString(),
    round: lastRound,
    ...(seamFile ? { seam: seamFile.seam } : {}),
  };
}

function gradeWith(seamFile: SeamFile | undefined, readings: readonly Reading[]) {
  if (!seamFile || !readings.length) return undefined;
  const file = { ...seamFile, readings: [...seamFile.readings, ...readings] };
  const parsed = parseSeamFile(file);
  if (!parsed.ok) return { problems: parsed.problems };
  const g = gradeSeam(parsed.value, BUILT_IN_CRITERIA[parsed.value.seam.acceptance.edition]);
  return {
    levelMet: g.levelMet,
    meetsRequired: g.meetsRequired,
    requiredLevel: g.requiredLevel,
    state: g.state,
    caution: g.caution,
  };
}

export interface ImportOptions {
  readonly file: string;
  readonly mapping?: string | undefined;
  readonly seam?: string | undefined;
  readonly json: boolean;
}

export async function importCommand(opts: ImportOptions): Promise<string> {
  const size = await fileSize(opts.file, 'Table');
  let mapping: ImportMapping | undefined;
  if (opts.mapping) {
    const m = parseMapping(await readJsonFile(opts.mapping, 'Mapping file'));
    if (!m.ok) {
      throw new InputError(
        `Mapping file "${opts.mapping}" is not valid:\n${m.problems.map((p) => `${p.path}: ${p.message}`).join('\n')}`,
      );
    }
    mapping = m.mapping;
  }
  const seamFile = await seamOf(opts.seam);
  const context = contextFor(seamFile);
  let suggested = false;
  if (!mapping && size <= MAX_TABLE_BYTES) {
    // Without a mapping, the columns are mapped by their header words (as the app's first suggestion).
    const head = new Uint8Array(await readHead(opts.file, 64 * 1024));
    const seen = inspectTable(head, head.length >= size);
    if (seen.ok) {
      mapping = seen.suggested;
      suggested = true;
    }
  }
  const t = new TableImport({ context, hasher: nodeHasher(), size, ...(mapping ? { mapping } : {}) });
  if (!t.refused)
    await stream(
      opts.file,
      (b) => t.push(b),
      () => t.refused,
    );
  const outcome: TableOutcome = t.finish();
  const result = {
    file: opts.file,
    importId: context.importId,
    ...(outcome.kind === 'refused'
      ? {
          refused: outcome.refusal,
          bytes: outcome.bytes ?? size,
          ...(outcome.sha256 ? { sha256: outcome.sha256 } : {}),
        }
      : {
          bytes: outcome.bytes,
          sha256: outcome.sha256,
          encoding: outcome.encoding,
          layout: {
            delimiter: outcome.layout.delimiter,
            decimal: outcome.layout.decimal,
            header: outcome.layout.header,
            dataStartLine: outcome.layout.dataStartLine,
          },
          columns: outcome.compiled.values.map((v) => ({
            column: v.name,
            target: v.target,
            unit: v.unit,
            unitFrom: v.unitSource,
          })),
          mapping: outcome.mapping,
          mappingSuggested: suggested,
          dataRows: outcome.dataRows,
          readings: outcome.readings,
          quarantined: outcome.quarantinedRows,
          quarantine: outcome.quarantine.map(({ line, reason }) => ({ line, reason })),
          grade: gradeWith(seamFile, outcome.readings),
        }),
  };
  const text = opts.json ? JSON.stringify(result, null, 2) : describeTable(result, outcome);
  if (outcome.kind === 'refused') throw new Refused(text);
  return text;
}

async function readHead(path: string, bytes: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let got = 0;
  for await (const c of createReadStream(path, { start: 0, end: bytes - 1 })) {
    chunks.push(c as Buffer);
    got += (c as Buffer).length;
    if (got >= bytes) break;
  }
  return Buffer.concat(chunks);
}

function describeTable(result: { sha256?: string }, o: TableOutcome): string {
  if (o.kind === 'refused') {
    return `Refused${o.refusal.line ? ` (line ${o.refusal.line})` : ''}: ${o.refusal.message}`;
  }
  const lines = [
    `${o.readings.length} readings from ${o.dataRows} data rows; ${o.quarantinedRows} rows quarantined.`,
    `SHA-256 ${result.sha256 ?? ''}`,
  ];
  for (const q of o.quarantine.slice(0, 50)) lines.push(`  line ${q.line}: ${q.reason}`);
  if (o.quarantinedRows > 50) lines.push(`  … and ${o.quarantinedRows - 50} more`);
  return lines.join('\n');
}

export interface ProfileCommandOptions {
  readonly file: string;
  readonly position?: number | undefined;
  readonly seam?: string | undefined;
  readonly json: boolean;
}

export async function profileCommand(opts: ProfileCommandOptions): Promise<string> {
  const size = await fileSize(opts.file, 'Profile file');
  const seamFile = await seamOf(opts.seam);
  const context = contextFor(seamFile);
  let outcome: ProfileOutcome;
  if (size > MAX_PROFILE_BYTES) {
    outcome = {
      kind: 'refused',
      refusal: {
        message: `The file is larger than ${MAX_PROFILE_BYTES / 1024 / 1024} MiB, the most a profile file may hold.`,
      },
      bytes: size,
    };
  } else {
    const p = new ProfileImport({
      context,
      hasher: nodeHasher(),
      ...(opts.position !== undefined ? { position: opts.position } : {}),
    });
    await stream(
      opts.file,
      (b) => p.push(b),
      () => p.refused,
    );
    outcome = p.finish();
  }
  if (outcome.kind === 'refused') {
    const text = opts.json
      ? JSON.stringify({ file: opts.file, refused: outcome.refusal, bytes: outcome.bytes }, null, 2)
      : `Refused: ${outcome.refusal.message}`;
    throw new Refused(text);
  }
  const round = (v: number | null, d = 3) => (v === null ? null : Number(v.toFixed(d)));
  const result = {
    file: opts.file,
    importId: context.importId,
    bytes: outcome.bytes,
    sha256: outcome.sha256,
    qualityThreshold: QUALITY_THRESHOLD,
    slices: outcome.slices.map((s) => ({
      position: s.position,
      line: s.line,
      points: s.geometry.points,
      quality: round(s.geometry.quality),
      flagged: s.geometry.flagged,
      problems: s.geometry.problems,
      toes: (s.geometry.toes ?? []).map((t, i) => ({
        plate: i + 1,
        x: round(t.x),
        flankAngle: round(t.flankAngle, 2),
        toeAngle: round(t.toeAngle, 2),
        toeRadius: round(t.toeRadius),
        radiusResidual: round(t.radiusResidual, 4),
        undercutDepth: round(t.undercutDepth),
      })),
      reinforcementHeight: round(s.geometry.reinforcementHeight),
      reinforcementWidth: round(s.geometry.reinforcementWidth),
      linearMisalignment: round(s.geometry.linearMisalignment),
      angularMisalignment: round(s.geometry.angularMisalignment, 2),
      noise: round(s.geometry.noise, 4),
    })),
    flagged: outcome.flaggedCount,
    readings: outcome.readings,
    quarantine: outcome.quarantine.map(({ line, reason }) => ({ line, reason })),
    grade: gradeWith(seamFile, outcome.readings),
  };
  if (opts.json) return JSON.stringify(result, null, 2);
  return [
    `${outcome.sliceCount} slices, ${outcome.flaggedCount} flagged (quality below ${QUALITY_THRESHOLD}); ${outcome.readings.length} readings. SHA-256 ${outcome.sha256}`,
    ...result.slices.map(
      (s) =>
        `  ${s.position} mm: q ${s.quality}${s.flagged ? ' FLAGGED' : ''}  θ ${s.toes.map((t) => t.flankAngle).join('/')}°  ρ ${s.toes.map((t) => t.toeRadius).join('/')} mm  h ${s.reinforcementHeight}  b ${s.reinforcementWidth}  e ${s.linearMisalignment}  β ${s.angularMisalignment}°${s.problems.length ? `  (${s.problems.join('; ')})` : ''}`,
    ),
  ].join('\n');
}
