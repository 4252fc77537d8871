// From stored records to the seam file the grading core takes. Records are events; the seam's state is folded
// from them the same way whatever order they arrived in: the set-up with the highest revision, each round once,
// per checklist item the device's latest answer (by its sequence number, never its clock), and every reading.
import { SEAM_FILE_FORMAT, type Reading, type Round, type Seam } from '../../domain/index.js';
import type { RecordBodies } from '../../protocol/index.js';
import type { GradeMaterial, GradeRecord } from '../storage/types.js';
import type { ViewingConditions } from '../../domain/model/viewing.js';

export interface LeftOut {
  readonly recordId: string;
  readonly reason: string;
}

export interface FoldedSeam {
  /** The newest receive sequence number among the records folded. */
  readonly basedOn: number;
  readonly seam: Seam | null;
  readonly rounds: Round[];
  readonly readings: { readonly recordId: string; readonly reading: Reading }[];
  readonly leftOut: LeftOut[];
  /** Per round, the viewing and lighting conditions in force (the latest record for the round). */
  readonly viewing: readonly RoundViewing[];
}

export interface RoundViewing {
  readonly round: number;
  readonly conditions: ViewingConditions;
  /** By the device clock: shown, never used for order. */
  readonly recordedAt: string;
  readonly recordId: string;
  /** How many records the round's conditions were given in (more than one: corrected). */
  readonly records: number;
}

function bodyOf<K extends keyof RecordBodies>(r: GradeRecord): RecordBodies[K] {
  if (r.body === null) throw new Error(`record ${r.id} came without its body and was not held already`);
  return JSON.parse(r.body) as RecordBodies[K];
}

/**
 * Folds a seam's records into its state. held: readings the caller holds parsed already, by record id, equal to
 * what parsing their stored bodies gives (the re-grade's fresh readings); their bodies need not be read or parsed.
 */
export function foldSeam(material: GradeMaterial, held?: ReadonlyMap<string, Reading>): FoldedSeam {
  const leftOut: LeftOut[] = [];
  let basedOn = 0;
  let setup: { revision: number; receiveSeq: number; seam: Seam } | null = null;
  const rounds = new Map<number, { receiveSeq: number; round: Round }>();
  const answers = new Map<string, GradeRecord[]>();
  const viewingRecords: GradeRecord[] = [];
  const readings: { recordId: string; reading: Reading }[] = [];

  for (const r of material.records) {
    basedOn = Math.max(basedOn, r.receiveSeq);
    switch (r.kind) {
      case 'seamSetup': {
        const body = bodyOf<'seamSetup'>(r);
        if (
          !setup ||
          body.revision > setup.revision ||
          (body.revision === setup.revision && r.receiveSeq > setup.receiveSeq)
        ) {
          setup = { revision: body.revision, receiveSeq: r.receiveSeq, seam: body.seam };
        }
        break;
      }
      case 'round': {
        const body = bodyOf<'round'>(r);
        const held = rounds.get(body.number);
        const round: Round = {
          number: body.number,
          kind: body.kind,
          startedAt: body.startedAt,
          ...(body.examiner ? { examiner: body.examiner } : {}),
          checklist: {},
        };
        if (!held || r.receiveSeq < held.receiveSeq) {
          if (held)
            leftOut.push({
              recordId: `round ${body.number} (received #${held.receiveSeq})`,
              reason: 'round started twice',
            });
          rounds.set(body.number, { receiveSeq: r.receiveSeq, round });
        } else {
          leftOut.push({
            recordId: r.id,
            reason: `round ${body.number} was started twice; the first one received counts`,
          });
        }
        break;
      }
      case 'checklistAnswer': {
        const body = bodyOf<'checklistAnswer'>(r);
        const key = `${body.round}\u0000${body.item}`;
        answers.set(key, [...(answers.get(key) ?? []), r]);
        break;
      }
      case 'reading':
        readings.push({ recordId: r.id, reading: held?.get(r.id) ?? bodyOf<'reading'>(r).reading });
        break;
      case 'viewing':
        // Not graded: the conditions are reported (foldViewing).
        viewingRecords.push(r);
        break;
      case 'tagLink':
        // Which tag leads to the seam: kept as a record, nothing to grade and nothing left out.
        break;
      default:
        leftOut.push({ recordId: r.id, reason: `records of kind "${r.kind}" are not graded` });
    }
  }

  for (const candidates of answers.values()) {
    const winner = latestAnswer(candidates);
    const body = bodyOf<'checklistAnswer'>(winner);
    const round = rounds.get(body.round);
    if (!round) {
      leftOut.push({
        recordId: winner.id,
        reason: `answers round ${body.round}, which this server has not received`,
      });
      continue;
    }
    round.round = { ...round.round, checklist: { ...round.round.checklist, [body.item]: body.answer } };
  }

  const viewing = foldViewing(viewingRecords);

  const seam =
    (setup as { seam: Seam } | null)?.seam ??
    (material.seam ? (JSON.parse(material.seam.setup) as Seam) : null);
  return {
    basedOn,
    seam,
    rounds: [...rounds.values()].map((r) => r.round).sort((a, b) => a.number - b.number),
    readings: readings.sort((a, b) =>
      a.reading.id < b.reading.id ? -1 : a.reading.id > b.reading.id ? 1 : 0,
    ),
    leftOut,
    viewing,
  };
}

/**
 * Per round, the viewing and lighting conditions in force, from a seam's viewing records alone (the rest of its
 * records do not change them): a correction is a later record for the same round.
 */
export function foldViewing(records: readonly GradeRecord[]): RoundViewing[] {
  const byRound = new Map<number, GradeRecord[]>();
  for (const r of records) {
    const round = bodyOf<'viewing'>(r).round;
    byRound.set(round, [...(byRound.get(round) ?? []), r]);
  }
  const viewing: RoundViewing[] = [];
  for (const [round, candidates] of byRound) {
    const winner = latestAnswer(candidates);
    const body = bodyOf<'viewing'>(winner);
    viewing.push({
      round,
      conditions: body.conditions,
      recordedAt: body.recordedAt,
      recordId: winner.id,
      records: candidates.length,
    });
  }
  return viewing.sort((a, b) => a.round - b.round);
}

/**
 * The answer (or viewing record) that counts. One device's answers are ordered by its sequence numbers (its clock may be wrong); between devices, the answer
 * received last counts.
 */
function latestAnswer(candidates: readonly GradeRecord[]): GradeRecord {
  const perDevice = new Map<string | null, GradeRecord>();
  for (const c of candidates) {
    const held = perDevice.get(c.deviceKid);
    if (
      !held ||
      c.deviceSeq > held.deviceSeq ||
      (c.deviceSeq === held.deviceSeq && c.receiveSeq > held.receiveSeq)
    ) {
      perDevice.set(c.deviceKid, c);
    }
  }
  let winner: GradeRecord | undefined;
  for (const c of perDevice.values()) if (!winner || c.receiveSeq > winner.receiveSeq) winner = c;
  return winner as GradeRecord;
}

/** The seam file for the grader (format and units fixed: records carry values in the stored units). */
export function seamFileOf(folded: FoldedSeam, readings: readonly Reading[]): unknown {
  return {
    format: SEAM_FILE_FORMAT,
    units: { length: 'mm', angle: 'deg' },
    seam: folded.seam,
    rounds: folded.rounds,
    readings,
  };
}
