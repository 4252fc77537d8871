// The review facts of one seam: the few values the queue filters and sorts on, taken from its review (server
// grade, assessment) and its records. Pure: the same material and grade give the same facts.
import { levelRank, type LevelMet } from '../../domain/index.js';
import type { DeviceGradeRow, ReviewFacts, SeamMaterial, SeamNamespace } from '../storage/types.js';
import type { SeamReview } from './seam-review.js';

const day = (iso: string | undefined): string | null => (iso ? iso.slice(0, 10) : null);

/** Whether every measured parameter had enough at-pitch positions; null when nothing was measured at pitch. */
export function samplingAdequate(review: SeamReview): boolean | null {
  const parameters = review.assessment?.sampling.parameters ?? [];
  if (!parameters.length) return null;
  return parameters.every((p) => p.count >= 2 && p.morePositions === 0 && p.settled);
}

/** The newest grade a device reported for the seam (by the device's batch number, then the kid). */
export function latestDeviceGrade(
  rows: readonly DeviceGradeRow[],
): { readonly kid: string; readonly levelMet: string | null; readonly state: string | null } | null {
  let best: DeviceGradeRow | null = null;
  for (const r of rows) if (!best || r.batchSeq > best.batchSeq) best = r;
  if (!best) return null;
  const g = JSON.parse(best.grade) as { levelMet?: string | null; state?: string };
  return { kid: best.deviceKid, levelMet: g.levelMet ?? null, state: g.state ?? null };
}

/** The server's level beside the device's: they differ when both graded and the levels are not the same. */
export function gradesDiffer(
  serverLevel: string | null,
  device: { levelMet: string | null } | null,
): boolean {
  return device !== null && (serverLevel ?? null) !== (device.levelMet ?? null);
}

/** Examiners named on the seam's rounds and readings. */
export function inspectorsOf(review: SeamReview): string[] {
  const names = new Set<string>();
  for (const r of review.folded.rounds) if (r.examiner) names.add(r.examiner.name);
  for (const { reading } of review.folded.readings) if (reading.examiner) names.add(reading.examiner.name);
  return [...names].sort();
}

export function reviewFactsOf(input: {
  readonly seamId: string;
  readonly namespace: SeamNamespace;
  readonly material: SeamMaterial;
  readonly review: SeamReview;
  readonly deviceGrades: readonly DeviceGradeRow[];
  readonly gradedAt: string;
  readonly now: string;
}): ReviewFacts {
  const { review, material } = input;
  const seam = review.folded.seam;
  const summary = review.summary;
  const grade = review.grade;
  const roundOfGrade =
    grade?.rounds.find((r) => r.round === grade.gradedRound) ?? grade?.rounds[grade.rounds.length - 1];
  const days: string[] = [];
  for (const r of review.folded.rounds) if (r.startedAt) days.push(r.startedAt.slice(0, 10));
  for (const { reading } of review.folded.readings) days.push(reading.recordedAt.slice(0, 10));
  days.sort();
  let lastReceived: string | undefined;
  for (const r of material.records)
    if (!lastReceived || r.receivedAt > lastReceived) lastReceived = r.receivedAt;
  const device = latestDeviceGrade(input.deviceGrades);
  const level = summary.levelMet as LevelMet | null;
  return {
    seamId: input.seamId,
    namespace: input.namespace,
    label: seam?.label ?? input.seamId,
    tags: seam?.tags ?? [],
    organisation: seam?.organisation ?? null,
    area: seam?.area ?? null,
    drawing: seam?.drawing ?? null,
    welder: seam?.welder ?? null,
    procedure: seam?.procedure ?? null,
    requiredLevel: summary.requiredLevel ?? grade?.requiredLevel ?? null,
    edition: seam?.acceptance.edition ?? null,
    state: summary.state,
    levelMet: level,
    levelRank: level === null ? null : levelRank(level),
    meetsRequired: summary.meetsRequired,
    gradedRound: summary.gradedRound,
    latestRound: review.folded.rounds[review.folded.rounds.length - 1]?.number ?? null,
    readingCount: summary.readingCount,
    borderlineCount: roundOfGrade?.borderlineCount ?? 0,
    fatFlag: review.assessment ? review.assessment.fatigue.flag : null,
    samplingAdequate: samplingAdequate(review),
    unverifiedRows: summary.unverifiedRows.length,
    deviceLevelMet: device?.levelMet ?? null,
    gradeMismatch: gradesDiffer(summary.levelMet, device),
    inspectedFirst: day(days[0]),
    inspectedLast: day(days[days.length - 1]),
    lastReceivedAt: lastReceived ?? null,
    basedOn: review.folded.basedOn,
    gradedAt: input.gradedAt,
    computedAt: input.now,
    inspectors: inspectorsOf(review),
  };
}
