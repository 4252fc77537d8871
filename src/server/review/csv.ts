// CSV exports: every reading of a selection of seams, and one summary line per seam, with units in the headers
// (values are in the stored units: mm, degrees, lux; header names hold no commas) and the viewing and lighting
// conditions of the reading's round, or the seam's graded round. Written with papaparse; a text cell that a
// spreadsheet would take for a formula (=, +, @ first, or - first with an operator after it) is prefixed with a
// quote; numbers stay numbers, and ids that merely start with a dash (key ids are base64url) stay as they are.
import Papa from 'papaparse';
import { PARAMETER_NAMES, PARAMETERS } from '../../domain/index.js';
import type { RoundViewing } from '../grading/fold.js';
import type { ReviewQueueRow } from '../storage/types.js';
import type { ReadingLine } from './seam-detail.js';
import { VIEWING_HEADERS, viewingByRound, viewingCells } from './viewing-columns.js';

const unit = (u: string) => (u === 'deg' ? 'deg' : u);

const FORMULA = /^[=+@\t\r]|^-.*[=+*/|!()&;\s]/;

const READING_HEADERS = [
  'seam id',
  'seam label',
  'reading id',
  'round',
  'position (mm)',
  'start (mm)',
  'end (mm)',
  'sampling',
  'toe plate',
  'toe side',
  'side',
  ...PARAMETER_NAMES.map((n) => `${n} (${unit(PARAMETERS[n].unit)})`),
  'misalignment basis',
  'status',
  'supersedes',
  'superseded by',
  'left out because',
  'instrument',
  'instrument resolution (mm)',
  'instrument resolution (deg)',
  'calibrated on',
  'examiner',
  'qualification',
  ...VIEWING_HEADERS,
  'recorded at UTC (device clock)',
  'device kid',
  'device name',
  'batch id',
  'received at UTC (server)',
] as const;

type Cell = string | number | null;

export function readingsCsv(
  seams: readonly {
    id: string;
    label: string;
    readings: readonly ReadingLine[];
    viewing: readonly RoundViewing[];
  }[],
): string {
  const rows: Cell[][] = [];
  for (const seam of seams) {
    const viewing = viewingByRound(seam.viewing);
    for (const l of seam.readings) {
      const r = l.reading;
      rows.push([
        seam.id,
        seam.label,
        r.id,
        r.round,
        r.position ?? null,
        r.start ?? null,
        r.end ?? null,
        r.sampling,
        r.toe?.plate ?? null,
        r.toe?.side ?? null,
        r.side ?? null,
        ...PARAMETER_NAMES.map((n) => r.values[n] ?? null),
        r.misalignmentBasis ?? null,
        l.status,
        r.supersedes ?? null,
        l.supersededBy,
        l.leftOutReason,
        r.instrument.id,
        r.instrument.resolutionMm ?? null,
        r.instrument.resolutionDeg ?? null,
        r.instrument.calibratedOn ?? null,
        r.examiner?.name ?? null,
        r.examiner?.qualification ?? null,
        ...viewingCells(viewing.get(r.round)),
        r.recordedAt,
        l.deviceKid,
        l.deviceName,
        l.batchId,
        l.receivedAt,
      ]);
    }
  }
  return Papa.unparse(
    { fields: [...READING_HEADERS], data: rows },
    { escapeFormulae: FORMULA, newline: '\r\n' },
  );
}

const SEAM_HEADERS = [
  'seam id',
  'label',
  'demo',
  'tags',
  'area',
  'drawing',
  'welder',
  'procedure (WPS)',
  'acceptance criteria',
  'required level',
  'server grade state',
  'level met (server)',
  'meets required',
  'graded round',
  'latest round',
  'viewing of round',
  ...VIEWING_HEADERS,
  'current readings',
  'borderline values',
  'unverified limit rows',
  'fatigue class flag (indicative)',
  'sampling adequate',
  'level met (device)',
  'device differs',
  'inspected first (device clock date)',
  'inspected last (device clock date)',
  'last received UTC (server)',
  'decision',
  'decision round',
  'decided by',
  'decided at UTC (server)',
  'reviewed on every record',
] as const;

/**
 * One line per seam. Its viewing conditions are those of the round its level comes from (the graded round, else
 * the latest), named in 'viewing of round'; the readings export gives every round's.
 */
export function seamsCsv(
  rows: readonly ReviewQueueRow[],
  viewing: ReadonlyMap<string, readonly RoundViewing[]>,
): string {
  const yesNo = (b: boolean | null) => (b === null ? null : b ? 'yes' : 'no');
  const data = rows.map((r): Cell[] => {
    const round = r.gradedRound ?? r.latestRound;
    const conditions = round === null ? undefined : viewingByRound(viewing.get(r.seamId) ?? []).get(round);
    return [
      r.seamId,
      r.label,
      r.namespace === 'demo' ? 'yes' : 'no',
      r.tags.join('; '),
      r.area,
      r.drawing,
      r.welder,
      r.procedure,
      r.edition,
      r.requiredLevel,
      r.state,
      r.levelMet === 'belowD' ? 'below D' : r.levelMet,
      yesNo(r.meetsRequired),
      r.gradedRound,
      r.latestRound,
      round,
      ...viewingCells(conditions),
      r.readingCount,
      r.borderlineCount,
      r.unverifiedRows,
      r.fatFlag,
      yesNo(r.samplingAdequate),
      r.deviceLevelMet === 'belowD' ? 'below D' : r.deviceLevelMet,
      yesNo(r.gradeMismatch),
      r.inspectedFirst,
      r.inspectedLast,
      r.lastReceivedAt,
      r.decision?.outcome ?? null,
      r.decision?.round ?? null,
      r.decision?.decidedByName ?? null,
      r.decision?.decidedAt ?? null,
      yesNo(r.reviewed),
    ];
  });
  return Papa.unparse({ fields: [...SEAM_HEADERS], data }, { escapeFormulae: FORMULA, newline: '\r\n' });
}
