// What the entry-check worker (workers/entry-check.worker.ts) does for the Gauge screen and the Seams list.
//
// The worker keeps its own copy of the seam on the Gauge screen: validated whole once when the screen opens,
// then extended one reading at a time, each new reading checked against the seam, its rounds and the readings so
// far (the same rules parseSeamFile applies to a whole file, in constant time). So a save costs the page one
// reading sent and a few hundred bytes back (the new reading's grade and the round's standing), never the whole
// seam as a structured clone nor a grade object per reading. Grading the whole seam stays in the worker.
import {
  BUILT_IN_CRITERIA,
  gradeSeam,
  parseSeamFile,
  SEAM_FILE_FORMAT,
  type Problem,
  type Reading,
  type ReadingGrade,
  type Round,
  type Seam,
  type SeamFile,
  type SeamGrade,
} from '../src/domain/index.js';

/** What a new reading is checked against. Grows as readings are appended; readings are never removed. */
export interface EntryContext {
  seam: Seam;
  rounds: readonly Round[];
  /** Every reading so far, by id. */
  readonly byId: Map<string, Reading>;
  /** Reading id → the id of the later reading that supersedes it (a correction or a withdrawal). */
  readonly supersededBy: Map<string, string>;
  /** How many readings count now (not withdrawals, not superseded), kept as readings arrive so no screen recounts. */
  counting: number;
}

type FileParts = Pick<SeamFile, 'seam' | 'rounds' | 'readings'>;

/** The context of a validated seam: O(n) once. */
export function entryContext(file: FileParts): EntryContext {
  const ctx: EntryContext = {
    seam: file.seam,
    rounds: file.rounds,
    byId: new Map(),
    supersededBy: new Map(),
    counting: 0,
  };
  for (const r of file.readings) addToContext(ctx, r);
  return ctx;
}

/** Records a reading that was checked and stored. */
export function addToContext(ctx: EntryContext, reading: Reading): void {
  // Counted once per id: the same reading read again (another tab's refresh) changes nothing.
  const fresh = !ctx.byId.has(reading.id);
  ctx.byId.set(reading.id, reading);
  if (!fresh) {
    if (reading.supersedes !== undefined) ctx.supersededBy.set(reading.supersedes, reading.id);
    return;
  }
  if (!reading.withdrawn) ctx.counting += 1;
  if (reading.supersedes !== undefined) {
    const target = ctx.byId.get(reading.supersedes);
    if (target && !target.withdrawn && !ctx.supersededBy.has(target.id)) ctx.counting -= 1;
    ctx.supersededBy.set(reading.supersedes, reading.id);
  }
}

/** The superseded reading stands alone in the check: its own link back (if any) is not followed. */
function standAlone(reading: Reading): Reading {
  const copy = { ...reading };
  delete copy.supersedes;
  delete copy.withdrawn;
  return copy;
}

const fileOf = (seam: Seam, rounds: readonly Round[], readings: readonly Reading[]) => ({
  format: SEAM_FILE_FORMAT,
  units: { length: 'mm', angle: 'deg' },
  seam,
  rounds,
  readings,
});

/**
 * The problems `reading` would have as `readings[index]` of the seam file made of the context plus this reading:
 * the problems parseSeamFile reports for that file about the seam, its rounds and this reading. The readings
 * already in the context were checked when they were stored, so only the one this reading supersedes (if any)
 * takes part, to resolve the reference; ids and "already superseded" are looked up. Constant time in the number
 * of readings.
 */
export function checkEntry(ctx: EntryContext, reading: Reading, index: number): Problem[] {
  const targetId = reading.supersedes;
  const target = targetId === undefined ? undefined : ctx.byId.get(targetId);
  const others = target ? [standAlone(target)] : [];
  const own = `readings[${others.length}]`;
  const at = `readings[${index}]`;
  const parsed = parseSeamFile(fileOf(ctx.seam, ctx.rounds, [...others, reading]), { allowNoReadings: true });
  const problems: Problem[] = [];
  if (!parsed.ok) {
    for (const p of parsed.problems) {
      const mine = p.path === own || p.path.startsWith(`${own}.`);
      // Problems of the superseded reading itself were judged when it was stored.
      if (p.path.startsWith('readings[') && !mine) continue;
      problems.push({
        path: mine ? at + p.path.slice(own.length) : p.path,
        message: p.message.replaceAll(own, at),
      });
    }
  }
  if (ctx.byId.has(reading.id)) {
    problems.push({
      path: `${at}.id`,
      message: `"${reading.id}" is used by another reading; ids must be unique`,
    });
  }
  const later = targetId === undefined ? undefined : ctx.supersededBy.get(targetId);
  if (target && later !== undefined) {
    problems.push({
      path: `${at}.supersedes`,
      message: `"${targetId}" is already superseded by "${later}"; correct the latest reading instead`,
    });
  }
  return problems;
}

/**
 * A seam's grade without the per-reading grades: every round keeps its level, checklist, imperfection summaries
 * and worst spot, and `readings` is empty. What the Seams list and the Gauge screen's "so far" line need.
 */
export type Standing = SeamGrade;

export type EntryReply =
  | { readonly ok: true; readonly standing: Standing; readonly reading: ReadingGrade | null }
  | { readonly ok: false; readonly problems: Problem[] }
  /** The worker's copy is not the one the page extends (another seam, or a count that differs): open again. */
  | { readonly ok: 'resync' };

export interface EntryUpdate {
  readonly seam: Seam;
  readonly rounds: readonly Round[];
  /** How many readings the page has given the worker so far; `added` follow them in order of entry. */
  readonly base: number;
  readonly added: readonly Reading[];
}

function standingOf(file: SeamFile): Standing {
  const grade = gradeSeam(file, BUILT_IN_CRITERIA[file.seam.acceptance.edition], { readings: 'columns' });
  return {
    ...grade,
    rounds: grade.rounds.map((round) => {
      const copy = { ...round, readings: [] };
      delete copy.columns;
      delete copy.readingIds;
      return copy;
    }),
  };
}

/** One reading's grade does not depend on the other readings: it is graded with its seam and round alone. */
function readingGradeOf(file: SeamFile, reading: Reading): ReadingGrade | null {
  const rounds = file.rounds.filter((r) => r.number === reading.round);
  const one = gradeSeam({ ...file, rounds, readings: [reading] });
  return one.rounds[0]?.readings[0] ?? null;
}

const sameJson = (a: unknown, b: unknown): boolean => JSON.stringify(a) === JSON.stringify(b);

export function createEntryCheckApi() {
  let copy: { file: SeamFile & { readings: Reading[] }; ctx: EntryContext } | null = null;

  const reply = (focus: string | null): EntryReply => {
    if (!copy) return { ok: 'resync' };
    const { file, ctx } = copy;
    const target = focus === null ? undefined : ctx.byId.get(focus);
    const counts = target !== undefined && !target.withdrawn && !ctx.supersededBy.has(target.id);
    return {
      ok: true,
      standing: standingOf(file),
      reading: target && counts ? readingGradeOf(file, target) : null,
    };
  };

  const open = (input: unknown): Problem[] => {
    copy = null;
    const parsed = parseSeamFile(input, { allowNoReadings: true });
    if (!parsed.ok) return parsed.problems;
    const file = { ...parsed.value, readings: [...parsed.value.readings] };
    copy = { file, ctx: entryContext(file) };
    return [];
  };

  return {
    /**
     * Takes the seam whole (validated here, off the page's thread) as the copy later updates extend, and grades
     * it; `focus` names a reading whose own grade is wanted too.
     */
    open(input: unknown, focus: string | null = null): EntryReply {
      const problems = open(input);
      return problems.length ? { ok: false, problems } : reply(focus);
    },

    /** Extends the copy with readings entered since (each checked as a new entry), and grades it. */
    update(u: EntryUpdate, focus: string | null = null): EntryReply {
      if (!copy || copy.file.seam.id !== u.seam.id || copy.file.readings.length !== u.base) {
        return { ok: 'resync' };
      }
      const { file, ctx } = copy;
      if (!sameJson(file.seam, u.seam) || !sameJson(file.rounds, u.rounds)) {
        // The set-up or the rounds changed (rare): the whole seam is checked again.
        const problems = open(fileOf(u.seam, u.rounds, [...file.readings, ...u.added]));
        return problems.length ? { ok: false, problems } : reply(focus);
      }
      for (const r of u.added) {
        const problems = checkEntry(ctx, r, file.readings.length);
        if (problems.length) {
          copy = null;
          return { ok: false, problems };
        }
        file.readings.push(r);
        addToContext(ctx, r);
      }
      return reply(focus);
    },

    /** One seam's standing, no copy kept (the Seams list's summaries). */
    standing(input: unknown): { ok: true; standing: Standing } | { ok: false; problems: Problem[] } {
      const parsed = parseSeamFile(input, { allowNoReadings: true });
      return parsed.ok ? { ok: true, standing: standingOf(parsed.value) } : parsed;
    },
  };
}

export type EntryCheckApi = ReturnType<typeof createEntryCheckApi>;
