// The demo yard: invented seams at an invented yard, so a first-time user sees every kind of result before
// recording real work. Everything here is made up; the store keeps it in the 'demo' namespace, marks it as demo
// and never sends it to a server. The set is chosen so the grades cover level B, C and D, below D, an
// incomplete checklist, and a seam that failed its first round and passed after repair.
import type { Reading, Round, Seam, SeamFile } from '../domain/index.js';

const YARD = 'Kestrel Point Yard (demo)';
const DEMO_PREFIX = 'demo-kp-';

/** Demo ids carry one prefix, so they can never be mistaken for, or collide with, ids made for real work. */
export const isDemoId = (id: string): boolean => id.startsWith(DEMO_PREFIX);

const INSTRUMENTS = {
  toe: { id: 'KP-TG-03', kind: 'toeGauge', resolutionMm: 0.1, resolutionDeg: 1, calibratedOn: '2026-06-02' },
  fillet: { id: 'KP-FG-07', kind: 'filletGauge', resolutionMm: 0.5, calibratedOn: '2026-04-11' },
  depth: { id: 'KP-DG-11', kind: 'depthGauge', resolutionMm: 0.05, calibratedOn: '2026-08-14' },
  misalignment: {
    id: 'KP-MG-01',
    kind: 'misalignmentGauge',
    resolutionMm: 0.1,
    resolutionDeg: 0.1,
    calibratedOn: '2026-05-20',
  },
} as const satisfies Record<string, Reading['instrument']>;

const EXAMINERS = {
  brennan: { name: 'A. Brennan', qualification: 'VT level 2' },
  iqbal: { name: 'S. Iqbal', qualification: 'VT level 2' },
} as const;

type Answers = Round['checklist'];

/** Every item answered "none found", then the given answers on top. */
function checklist(over: Answers = {}): Answers {
  return {
    crack: { answer: 'noneFound' },
    craterCrack: { answer: 'noneFound' },
    lackOfFusion: { answer: 'noneFound' },
    burnThrough: { answer: 'noneFound' },
    porosity: { answer: 'noneFound' },
    rootPorosity: { answer: 'noneFound' },
    poorRestart: { answer: 'noneFound' },
    strayArc: { answer: 'noneFound' },
    spatter: { answer: 'noneFound' },
    temperColour: { answer: 'noneFound' },
    ...over,
  };
}

type ReadingPart = Omit<Reading, 'id' | 'seamId' | 'source' | 'sampling' | 'instrument'> &
  Partial<Pick<Reading, 'sampling' | 'instrument'>>;

/** Readings of one seam, numbered in the order given. */
function readings(seamId: string, parts: readonly ReadingPart[]): Reading[] {
  return parts.map((part, i) => ({
    id: `${seamId}-r${String(i + 1).padStart(2, '0')}`,
    sampling: 'atPitch',
    instrument: INSTRUMENTS.toe,
    source: { kind: 'gauge' },
    ...part,
  }));
}

function seamFile(seam: Seam, rounds: Round[], parts: readonly ReadingPart[]): SeamFile {
  return {
    format: 'beadbook.seam/1',
    units: { length: 'mm', angle: 'deg' },
    seam,
    rounds,
    readings: readings(seam.id, parts),
  };
}

const base = {
  organisation: YARD,
  material: { name: 'S355J2+N', group: '1.2', kind: 'steel' },
  circumferential: false,
  surface: 'asWelded',
} as const;

const face1 = { plate: 1, side: 'face' } as const;
const face2 = { plate: 2, side: 'face' } as const;

/** Deck splice, shop butt weld: every value within level B, required C (EXC2). Includes one correction. */
function deckSplice(): SeamFile {
  const id = `${DEMO_PREFIX}014`;
  return seamFile(
    {
      ...base,
      id,
      label: 'Deck splice 14, frame 22–23',
      tags: ['KP-014'],
      area: 'Berth 3, block 7',
      drawing: 'KP-7-210 rev C',
      drawingPosition: 'W14',
      joint: { type: 'butt', preparation: 'singleV', sides: 'one', setting: 'shopFlat' },
      plate1: { thickness: 12 },
      plate2: { thickness: 12 },
      length: 1200,
      process: '135',
      welder: 'W-027',
      procedure: 'WPS-KP-135-07',
      weldedAt: '2026-11-18T14:05:00Z',
      acceptance: { edition: 'ISO 5817:2014', preset: 'EXC2' },
      // Invented design data, so the demo shows km, the fatigue-class flag and a life figure.
      fatigue: {
        loaded: true,
        requiredFat: 71,
        designStressRange: 45,
        cycles: 2_000_000,
        membraneStress: 60,
        restraint: 'pinned',
        freeLength1: 300,
        freeLength2: 300,
        ndt: true,
      },
    },
    [
      {
        number: 1,
        kind: 'first',
        startedAt: '2026-11-19T08:10:00Z',
        examiner: EXAMINERS.brennan,
        checklist: checklist(),
      },
    ],
    [
      {
        round: 1,
        position: 150,
        toe: face1,
        values: { toeAngle: 162, undercutDepth: 0.2 },
        recordedAt: '2026-11-19T08:22:00Z',
      },
      { round: 1, position: 150, toe: face2, values: { toeAngle: 158 }, recordedAt: '2026-11-19T08:23:00Z' },
      {
        round: 1,
        position: 150,
        side: 'face',
        values: { reinforcementHeight: 1.6, reinforcementWidth: 14 },
        recordedAt: '2026-11-19T08:25:00Z',
      },
      {
        round: 1,
        position: 600,
        values: { linearMisalignment: 1.1 },
        instrument: INSTRUMENTS.misalignment,
        recordedAt: '2026-11-19T08:34:00Z',
      },
      // A slip of the finger corrected at once: the correction supersedes the reading above.
      {
        round: 1,
        position: 600,
        values: { linearMisalignment: 0.6 },
        instrument: INSTRUMENTS.misalignment,
        recordedAt: '2026-11-19T08:35:00Z',
        supersedes: `${id}-r04`,
      },
      { round: 1, position: 1050, toe: face1, values: { toeAngle: 155 }, recordedAt: '2026-11-19T08:41:00Z' },
      // More positions at the pitch, so the sampling statistics have something to settle on.
      { round: 1, position: 300, toe: face1, values: { toeAngle: 160 }, recordedAt: '2026-11-19T08:44:00Z' },
      { round: 1, position: 450, toe: face1, values: { toeAngle: 157 }, recordedAt: '2026-11-19T08:46:00Z' },
      { round: 1, position: 750, toe: face1, values: { toeAngle: 159 }, recordedAt: '2026-11-19T08:48:00Z' },
      { round: 1, position: 900, toe: face1, values: { toeAngle: 156 }, recordedAt: '2026-11-19T08:50:00Z' },
      {
        round: 1,
        position: 300,
        values: { linearMisalignment: 0.4 },
        instrument: INSTRUMENTS.misalignment,
        recordedAt: '2026-11-19T08:52:00Z',
      },
      {
        round: 1,
        position: 900,
        values: { linearMisalignment: 0.5 },
        instrument: INSTRUMENTS.misalignment,
        recordedAt: '2026-11-19T08:54:00Z',
      },
    ],
  );
}

/** Stiffener to web, shop fillet weld: convexity within C but not B, required C. */
function stiffener(): SeamFile {
  const id = `${DEMO_PREFIX}122`;
  return seamFile(
    {
      ...base,
      id,
      label: 'Web stiffener 22, port side',
      tags: ['KP-122'],
      area: 'Panel line 2',
      drawing: 'KP-4-031 rev B',
      drawingPosition: 'S22',
      joint: { type: 'filletT', preparation: 'fillet', sides: 'two', setting: 'shopFlat' },
      plate1: { thickness: 10 },
      plate2: { thickness: 8 },
      nominalThroat: 4,
      length: 800,
      process: '135',
      welder: 'W-013',
      procedure: 'WPS-KP-135-03',
      weldedAt: '2026-11-17T11:20:00Z',
      acceptance: { edition: 'ISO 5817:2014', level: 'C' },
    },
    [
      {
        number: 1,
        kind: 'first',
        startedAt: '2026-11-18T13:00:00Z',
        examiner: EXAMINERS.iqbal,
        checklist: checklist(),
      },
    ],
    [
      {
        round: 1,
        position: 100,
        side: 'face',
        values: { throat: 4.5, convexity: 2.3, reinforcementWidth: 10 },
        instrument: INSTRUMENTS.fillet,
        recordedAt: '2026-11-18T13:08:00Z',
      },
      { round: 1, position: 100, toe: face1, values: { toeAngle: 126 }, recordedAt: '2026-11-18T13:10:00Z' },
      {
        round: 1,
        position: 500,
        side: 'face',
        values: { throat: 4.2, convexity: 1.5, reinforcementWidth: 9 },
        instrument: INSTRUMENTS.fillet,
        recordedAt: '2026-11-18T13:16:00Z',
      },
    ],
  );
}

/** Hatch coaming, site butt weld: undercut within D only, required D (EXC1). Includes one withdrawn reading. */
function hatchCoaming(): SeamFile {
  const id = `${DEMO_PREFIX}118`;
  return seamFile(
    {
      ...base,
      id,
      label: 'Hatch coaming 3, aft corner',
      tags: ['KP-118'],
      area: 'Berth 2, deck',
      drawing: 'KP-2-144 rev A',
      drawingPosition: 'C3',
      joint: { type: 'butt', preparation: 'singleBevel', sides: 'one', setting: 'site' },
      plate1: { thickness: 10 },
      plate2: { thickness: 10 },
      length: 600,
      process: '136',
      welder: 'W-041',
      procedure: 'WPS-KP-136-02',
      weldedAt: '2026-11-20T09:40:00Z',
      acceptance: { edition: 'ISO 5817:2014', preset: 'EXC1' },
    },
    [
      {
        number: 1,
        kind: 'first',
        startedAt: '2026-11-21T10:15:00Z',
        examiner: EXAMINERS.brennan,
        checklist: checklist(),
      },
    ],
    [
      {
        round: 1,
        start: 220,
        end: 236,
        toe: face1,
        sampling: 'targeted',
        values: { undercutDepth: 0.8 },
        instrument: INSTRUMENTS.depth,
        recordedAt: '2026-11-21T10:24:00Z',
      },
      { round: 1, position: 300, toe: face2, values: { toeAngle: 128 }, recordedAt: '2026-11-21T10:29:00Z' },
      { round: 1, position: 450, toe: face2, values: { toeAngle: 112 }, recordedAt: '2026-11-21T10:31:00Z' },
      // Entered on the wrong seam and taken back: a withdrawal, so the reading stays on record but out of the grade.
      {
        round: 1,
        position: 450,
        values: {},
        withdrawn: true,
        supersedes: `${id}-r03`,
        recordedAt: '2026-11-21T10:32:00Z',
      },
    ],
  );
}

/** Crane rail bracket, site fillet weld: a crack found and deep undercut, so below D. */
function craneBracket(): SeamFile {
  const id = `${DEMO_PREFIX}203`;
  return seamFile(
    {
      ...base,
      id,
      label: 'Crane rail bracket 3, web to flange',
      tags: ['KP-203'],
      area: 'Berth 1, quayside',
      drawing: 'KP-1-088 rev A',
      drawingPosition: 'F3',
      joint: { type: 'filletT', preparation: 'fillet', sides: 'two', setting: 'site' },
      plate1: { thickness: 16 },
      plate2: { thickness: 10 },
      nominalThroat: 5,
      length: 240,
      process: '136',
      welder: 'W-041',
      procedure: 'WPS-KP-136-02',
      weldedAt: '2026-11-20T10:30:00Z',
      acceptance: { edition: 'ISO 5817:2014', level: 'C' },
    },
    [
      {
        number: 1,
        kind: 'first',
        startedAt: '2026-11-21T07:45:00Z',
        examiner: EXAMINERS.iqbal,
        checklist: checklist({
          crack: { answer: 'present', position: 232, note: 'toe crack near the stop end' },
        }),
      },
    ],
    [
      {
        round: 1,
        start: 180,
        end: 214,
        toe: face2,
        sampling: 'targeted',
        values: { undercutDepth: 1.4 },
        instrument: INSTRUMENTS.depth,
        recordedAt: '2026-11-21T07:58:00Z',
      },
      {
        round: 1,
        position: 60,
        side: 'face',
        values: { throat: 5.2, convexity: 1.2, reinforcementWidth: 9 },
        instrument: INSTRUMENTS.fillet,
        recordedAt: '2026-11-21T08:03:00Z',
      },
    ],
  );
}

/** Bulkhead seam, site butt weld: checklist not finished yet, so the seam is incomplete, not passed. */
function bulkhead(): SeamFile {
  const id = `${DEMO_PREFIX}121`;
  const partial = checklist();
  delete partial.rootPorosity;
  delete partial.temperColour;
  return seamFile(
    {
      ...base,
      id,
      label: 'Bulkhead 9 vertical seam',
      tags: ['KP-121'],
      area: 'Berth 3, block 9',
      drawing: 'KP-9-017 rev D',
      drawingPosition: 'V2',
      joint: {
        type: 'butt',
        preparation: 'doubleV',
        sides: 'two',
        setting: 'site',
        faceSideNote: 'fore side',
      },
      plate1: { thickness: 14 },
      plate2: { thickness: 14 },
      length: 2400,
      process: '135',
      welder: 'W-008',
      procedure: 'WPS-KP-135-11',
      weldedAt: '2026-11-22T16:10:00Z',
      acceptance: { edition: 'ISO 5817:2014', preset: 'EXC2' },
    },
    [
      {
        number: 1,
        kind: 'first',
        startedAt: '2026-11-23T08:00:00Z',
        examiner: EXAMINERS.brennan,
        checklist: partial,
      },
    ],
    [
      {
        round: 1,
        position: 200,
        toe: face1,
        values: { toeAngle: 151, undercutDepth: 0.3 },
        recordedAt: '2026-11-23T08:12:00Z',
      },
      {
        round: 1,
        position: 200,
        side: 'face',
        values: { reinforcementHeight: 2.2, reinforcementWidth: 18 },
        recordedAt: '2026-11-23T08:14:00Z',
      },
    ],
  );
}

/** Pump foundation, shop fillet weld: round 1 fails C (crater crack, undercut D); after repair, round 2 passes. */
function pumpFoundation(): SeamFile {
  const id = `${DEMO_PREFIX}207`;
  return seamFile(
    {
      ...base,
      id,
      label: 'Pump foundation 2, top plate',
      tags: ['KP-207'],
      area: 'Engine room module',
      drawing: 'KP-6-052 rev A',
      drawingPosition: 'P2',
      joint: { type: 'filletT', preparation: 'fillet', sides: 'two', setting: 'shopFlat' },
      plate1: { thickness: 12 },
      plate2: { thickness: 10 },
      nominalThroat: 5,
      length: 480,
      process: '135',
      welder: 'W-019',
      procedure: 'WPS-KP-135-03',
      weldedAt: '2026-11-16T15:00:00Z',
      acceptance: { edition: 'ISO 5817:2014', level: 'C' },
    },
    [
      {
        number: 1,
        kind: 'first',
        startedAt: '2026-11-17T09:00:00Z',
        examiner: EXAMINERS.iqbal,
        checklist: checklist({ craterCrack: { answer: 'present', position: 478, note: 'at the stop end' } }),
      },
      {
        number: 2,
        kind: 'afterRepair',
        startedAt: '2026-11-19T14:30:00Z',
        examiner: EXAMINERS.iqbal,
        checklist: checklist(),
      },
    ],
    [
      {
        round: 1,
        start: 120,
        end: 150,
        toe: face1,
        sampling: 'targeted',
        values: { undercutDepth: 0.9 },
        instrument: INSTRUMENTS.depth,
        recordedAt: '2026-11-17T09:12:00Z',
      },
      {
        round: 1,
        position: 240,
        side: 'face',
        values: { throat: 5.4, convexity: 1.4, reinforcementWidth: 10 },
        instrument: INSTRUMENTS.fillet,
        recordedAt: '2026-11-17T09:18:00Z',
      },
      {
        round: 2,
        start: 120,
        end: 150,
        toe: face1,
        sampling: 'targeted',
        values: { undercutDepth: 0.2 },
        instrument: INSTRUMENTS.depth,
        recordedAt: '2026-11-19T14:41:00Z',
      },
      { round: 2, position: 470, toe: face1, values: { toeAngle: 124 }, recordedAt: '2026-11-19T14:46:00Z' },
      {
        round: 2,
        position: 240,
        side: 'face',
        values: { throat: 5.3, convexity: 1.3, reinforcementWidth: 10 },
        instrument: INSTRUMENTS.fillet,
        recordedAt: '2026-11-19T14:50:00Z',
      },
    ],
  );
}

/** The demo yard's seam files, made fresh on each call. Pure: no clock, no randomness. */
export function kestrelPointYard(): SeamFile[] {
  return [deckSplice(), stiffener(), hatchCoaming(), craneBracket(), bulkhead(), pumpFoundation()];
}
