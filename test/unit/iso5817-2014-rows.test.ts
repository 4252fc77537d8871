// Every row of the built-in ISO 5817:2014 table, band by band and level by level. The limits below are written
// out by hand from the limits reference (acceptance-limits.md §2), never read from the engine's table: each case
// states t, a or b and the limit each level gives there. For every level the test grades the value exactly on
// the limit (equality passes: "h ≤", "α ≥") and a value 0.01 past it (it fails), then checks the level met, the
// governing limit at the required level and the margin. "Not permitted" is a limit of 0: 0 passes, 0.01 fails.
import { describe, expect, it } from 'vitest';
import { ISO5817_2014_ROWS } from '../../src/domain/criteria/iso5817-2014.js';
import { LEVELS, type Level, type Reading, type Seam } from '../../src/domain/index.js';
import { buttSeam, filletSeam, reading } from '../support/seam-builder.js';
import { expectedLevel, requiring, rowGradeOf, typed, type HandLimits } from '../support/grade-one.js';

const NP = 0; // "not permitted": any h > 0 fails
const UNLIMITED = Infinity;
const RECALLED = 'from memory (recalled, unverified)';

type Sources = Readonly<Record<Level, string>>;
const same = (s: string): Sources => ({ D: s, C: s, B: s });

interface RowCase {
  readonly rowId: string;
  /** Standard, edition, table and row. */
  readonly cite: string;
  /** Where each level's limit stands in the limits reference. */
  readonly src: Sources;
  /** What the case is about: band, band edge, cap, basis. */
  readonly label: string;
  /** The case picks t, a or b itself (band edge, cap): the boundary is derived from the table. */
  readonly derived: boolean;
  readonly seam: Seam;
  /** A reading whose graded quantity (h, or α for toe angles) is the given value. */
  readonly make: (h: number) => Reading;
  readonly limits: HandLimits;
  /** The thickness the row must use (band and formula). */
  readonly t: number;
  readonly angle?: boolean;
}

const butt = (t: number, over: Partial<Seam> = {}): Seam =>
  buttSeam({ plate1: { thickness: t }, plate2: { thickness: t }, ...over });
const fillet = (t: number, a: number): Seam =>
  filletSeam({ plate1: { thickness: t }, plate2: { thickness: t }, nominalThroat: a });
const values = (name: keyof Reading['values'], h: number): Reading['values'] => ({ [name]: h });
const atToe = (name: keyof Reading['values']) => (h: number) =>
  reading(values(name, h), { toe: { plate: 1, side: 'face' } });
const onSide = (name: keyof Reading['values'], side: 'face' | 'root') => (h: number) =>
  reading(values(name, h), { side });
const atSpot = (name: keyof Reading['values']) => (h: number) => reading(values(name, h));
const withWidth =
  (name: 'reinforcementHeight' | 'convexity', b: number, side: 'face' | 'root') =>
  (h: number): Reading =>
    reading({ [name]: h, reinforcementWidth: b }, { side });

// Per-level sources, as the limits reference gives them (§2, confidence column).
const P = (keys: string): string => `P: ${keys}`;
const SRC = {
  pore: same(P('S1')),
  crater: same(P('S1')),
  irp: same(P('S1, S2')),
  undercut: { D: P('S2, S6'), C: P('S2, S3'), B: P('S2, S4') },
  groove: same(P('S2')),
  excessMetal: { D: P('S1, S2'), C: P('S1, S2'), B: P('S2') },
  convexity: same(P('S2')),
  penetration: same(P('S2')),
  toeButt: { D: RECALLED, C: 'S3', B: 'S4' },
  toeFillet: { D: RECALLED, C: 'S3', B: RECALLED },
  overlap: { D: RECALLED, C: 'S3', B: 'S4' },
  sagging: { D: RECALLED, C: 'S3', B: 'S4' },
  asymmetry: { D: 'S5 (EN 25817)', C: 'S3, S5', B: 'S4, S5' },
  concavity: { D: RECALLED, C: 'S3', B: 'S4' },
  throatThin: { D: RECALLED, C: RECALLED, B: 'S4' },
  throatThick: {
    D: `S5 (EN 25817), ${RECALLED} for 2014`,
    C: `S5 (EN 25817), ${RECALLED} for 2014`,
    B: 'S4',
  },
  throatExcess: { D: RECALLED, C: 'S5', B: 'S4' },
  misalignThin: same(`${RECALLED}; seen only in 2023 text (S8)`),
  misalignThick: same(`${RECALLED}; 2023 text S8`),
  gapThin: same(`${RECALLED}; seen only in 2023 text (S8)`),
  gapThick: same('S5 (EN 25817), S8 (2023)'),
} as const;

const row = (n: string, what: string) => `ISO 5817:2014 Table 1 row ${n} (${what})`;

const CASES: readonly RowCase[] = [
  // 1.3 surface pore, butt: d ≤ 0.3 s (D), 0.2 s (C) for t > 3 with caps 3 and 2; C, B not permitted for t ≤ 3.
  {
    rowId: '1.3-butt',
    cite: row('1.3', '2017 surface pore, butt weld'),
    src: SRC.pore,
    label: 't = 3.0, band edge: 0.5–3 band, s = 3 → D 0.3·s = 0.9, C and B not permitted',
    derived: true,
    seam: butt(3),
    make: atSpot('poreDiameter'),
    limits: { D: 0.9, C: NP, B: NP },
    t: 3,
  },
  {
    rowId: '1.3-butt',
    cite: row('1.3', '2017 surface pore, butt weld'),
    src: SRC.pore,
    label: 't = 3.01, band edge: > 3 band, s = 3.01 → D 0.903, C 0.602, B not permitted',
    derived: true,
    seam: butt(3.01),
    make: atSpot('poreDiameter'),
    limits: { D: 0.903, C: 0.602, B: NP },
    t: 3.01,
  },
  {
    rowId: '1.3-butt',
    cite: row('1.3', '2017 surface pore, butt weld'),
    src: SRC.pore,
    label: 't > 3, s = 8: formulas govern → D 2.4, C 1.6',
    derived: false,
    seam: butt(8),
    make: atSpot('poreDiameter'),
    limits: { D: 2.4, C: 1.6, B: NP },
    t: 8,
  },
  {
    rowId: '1.3-butt',
    cite: row('1.3', '2017 surface pore, butt weld'),
    src: SRC.pore,
    label: 't > 3, s = 12, caps govern: 0.3·s = 3.6 > max 3, 0.2·s = 2.4 > max 2',
    derived: true,
    seam: butt(12),
    make: atSpot('poreDiameter'),
    limits: { D: 3, C: 2, B: NP },
    t: 12,
  },
  {
    rowId: '1.3-butt',
    cite: row('1.3', '2017 surface pore, butt weld'),
    src: SRC.pore,
    label: 'plates 10 and 6, no butt thickness given: s = thinner plate 6 → D 1.8, C 1.2',
    derived: false,
    seam: buttSeam({ plate1: { thickness: 10 }, plate2: { thickness: 6 } }),
    make: atSpot('poreDiameter'),
    limits: { D: 1.8, C: 1.2, B: NP },
    t: 6,
  },
  {
    rowId: '1.3-butt',
    cite: row('1.3', '2017 surface pore, butt weld'),
    src: SRC.pore,
    label: 'plates 10, partial penetration s = 5: D 0.3·5 = 1.5, C 0.2·5 = 1.0 (band from t = 10)',
    derived: false,
    seam: butt(10, { buttThickness: 5 }),
    make: atSpot('poreDiameter'),
    limits: { D: 1.5, C: 1, B: NP },
    t: 10,
  },
  // 1.3 surface pore, fillet: the same in a.
  {
    rowId: '1.3-fillet',
    cite: row('1.3', '2017 surface pore, fillet weld'),
    src: SRC.pore,
    label: 't = 3.0, a = 4, band edge: D 0.3·a = 1.2, C and B not permitted',
    derived: true,
    seam: fillet(3, 4),
    make: atSpot('poreDiameter'),
    limits: { D: 1.2, C: NP, B: NP },
    t: 3,
  },
  {
    rowId: '1.3-fillet',
    cite: row('1.3', '2017 surface pore, fillet weld'),
    src: SRC.pore,
    label: 't = 3.01, a = 4, band edge: D 1.2, C 0.2·a = 0.8, B not permitted',
    derived: true,
    seam: fillet(3.01, 4),
    make: atSpot('poreDiameter'),
    limits: { D: 1.2, C: 0.8, B: NP },
    t: 3.01,
  },
  {
    rowId: '1.3-fillet',
    cite: row('1.3', '2017 surface pore, fillet weld'),
    src: SRC.pore,
    label: 't = 10, a = 12, caps govern: 0.3·a = 3.6 > max 3, 0.2·a = 2.4 > max 2',
    derived: true,
    seam: fillet(10, 12),
    make: atSpot('poreDiameter'),
    limits: { D: 3, C: 2, B: NP },
    t: 10,
  },
  // 1.4 end crater pipe: h ≤ 0.2 t (D); for t > 3 max 2, and C 0.1 t max 1.
  {
    rowId: '1.4',
    cite: row('1.4', '2025 end crater pipe'),
    src: SRC.crater,
    label: 't = 3.0, band edge: D 0.2·t = 0.6, C and B not permitted',
    derived: true,
    seam: butt(3),
    make: atSpot('endCraterDepth'),
    limits: { D: 0.6, C: NP, B: NP },
    t: 3,
  },
  {
    rowId: '1.4',
    cite: row('1.4', '2025 end crater pipe'),
    src: SRC.crater,
    label: 't = 3.01, band edge: D 0.602, C 0.301, B not permitted',
    derived: true,
    seam: butt(3.01),
    make: atSpot('endCraterDepth'),
    limits: { D: 0.602, C: 0.301, B: NP },
    t: 3.01,
  },
  {
    rowId: '1.4',
    cite: row('1.4', '2025 end crater pipe'),
    src: SRC.crater,
    label: 't = 20, caps govern: 0.2·t = 4 > max 2, 0.1·t = 2 > max 1',
    derived: true,
    seam: butt(20),
    make: atSpot('endCraterDepth'),
    limits: { D: 2, C: 1, B: NP },
    t: 20,
  },
  {
    rowId: '1.4',
    cite: row('1.4', '2025 end crater pipe'),
    src: SRC.crater,
    label: 'fillet weld, t = 8, a = 5: written in t (thinner plate) → D 1.6, C 0.8',
    derived: false,
    seam: fillet(8, 5),
    make: atSpot('endCraterDepth'),
    limits: { D: 1.6, C: 0.8, B: NP },
    t: 8,
  },
  // 1.6 incomplete root penetration, single-sided butt: one band ≥ 0.5, D short h ≤ 0.2 t max 2.
  {
    rowId: '1.6',
    cite: row('1.6', '4021 incomplete root penetration, single-sided butt weld'),
    src: SRC.irp,
    label: 't = 3.0 (one band ≥ 0.5): D 0.2·t = 0.6, C and B not permitted',
    derived: false,
    seam: butt(3),
    make: onSide('incompleteRootPenetration', 'root'),
    limits: { D: 0.6, C: NP, B: NP },
    t: 3,
  },
  {
    rowId: '1.6',
    cite: row('1.6', '4021 incomplete root penetration, single-sided butt weld'),
    src: SRC.irp,
    label: 't = 3.01, no band change at 3: D 0.602',
    derived: true,
    seam: butt(3.01),
    make: onSide('incompleteRootPenetration', 'root'),
    limits: { D: 0.602, C: NP, B: NP },
    t: 3.01,
  },
  {
    rowId: '1.6',
    cite: row('1.6', '4021 incomplete root penetration, single-sided butt weld'),
    src: SRC.irp,
    label: 't = 15, cap governs: 0.2·t = 3 > max 2',
    derived: true,
    seam: butt(15),
    make: onSide('incompleteRootPenetration', 'root'),
    limits: { D: 2, C: NP, B: NP },
    t: 15,
  },
  // 1.7 undercut: t ≤ 3 short h ≤ 0.2 t (D), 0.1 t (C), B not permitted; t > 3 0.2 t max 1, 0.1 t max 0.5,
  // 0.05 t max 0.5.
  {
    rowId: '1.7',
    cite: row('1.7', '5011/5012 undercut'),
    src: SRC.undercut,
    label: 't = 0.5, thinnest in scope: D 0.1, C 0.05, B not permitted',
    derived: false,
    seam: butt(0.5),
    make: atToe('undercutDepth'),
    limits: { D: 0.1, C: 0.05, B: NP },
    t: 0.5,
  },
  {
    rowId: '1.7',
    cite: row('1.7', '5011/5012 undercut'),
    src: SRC.undercut,
    label: 't = 3.0, band edge: 0.5–3 band → D 0.6, C 0.3, B not permitted',
    derived: true,
    seam: butt(3),
    make: atToe('undercutDepth'),
    limits: { D: 0.6, C: 0.3, B: NP },
    t: 3,
  },
  {
    rowId: '1.7',
    cite: row('1.7', '5011/5012 undercut'),
    src: SRC.undercut,
    label: 't = 3.01, band edge: > 3 band → D 0.602, C 0.301, B 0.05·t = 0.1505',
    derived: true,
    seam: butt(3.01),
    make: atToe('undercutDepth'),
    limits: { D: 0.602, C: 0.301, B: 0.1505 },
    t: 3.01,
  },
  {
    rowId: '1.7',
    cite: row('1.7', '5011/5012 undercut'),
    src: SRC.undercut,
    label: 't = 4, formulas govern at every level: D 0.8, C 0.4, B 0.2',
    derived: false,
    seam: butt(4),
    make: atToe('undercutDepth'),
    limits: { D: 0.8, C: 0.4, B: 0.2 },
    t: 4,
  },
  {
    rowId: '1.7',
    cite: row('1.7', '5011/5012 undercut'),
    src: SRC.undercut,
    label: 't = 20, caps govern at every level: 4 > max 1, 2 > max 0.5, 1 > max 0.5',
    derived: true,
    seam: butt(20),
    make: atToe('undercutDepth'),
    limits: { D: 1, C: 0.5, B: 0.5 },
    t: 20,
  },
  // 1.8 shrinkage groove (root side).
  {
    rowId: '1.8',
    cite: row('1.8', '5013 shrinkage groove'),
    src: SRC.groove,
    label: 't = 3.0, band edge: D 0.2 mm + 0.1·t = 0.5, C short 0.3, B not permitted',
    derived: true,
    seam: butt(3),
    make: onSide('shrinkageGroove', 'root'),
    limits: { D: 0.5, C: 0.3, B: NP },
    t: 3,
  },
  {
    rowId: '1.8',
    cite: row('1.8', '5013 shrinkage groove'),
    src: SRC.groove,
    label: 't = 3.01, band edge: D 0.602, C 0.301, B 0.1505 (all short)',
    derived: true,
    seam: butt(3.01),
    make: onSide('shrinkageGroove', 'root'),
    limits: { D: 0.602, C: 0.301, B: 0.1505 },
    t: 3.01,
  },
  {
    rowId: '1.8',
    cite: row('1.8', '5013 shrinkage groove'),
    src: SRC.groove,
    label: 't = 25, caps govern: 5 > max 2, 2.5 > max 1, 1.25 > max 0.5',
    derived: true,
    seam: butt(25),
    make: onSide('shrinkageGroove', 'root'),
    limits: { D: 2, C: 1, B: 0.5 },
    t: 25,
  },
  // 1.9 excess weld metal (face of a butt weld): h ≤ 1 mm + k·b, one band.
  {
    rowId: '1.9',
    cite: row('1.9', '502 excess weld metal, butt weld, face side'),
    src: SRC.excessMetal,
    label: 'b = 10: D 1 + 2.5 = 3.5, C 1 + 1.5 = 2.5, B 1 + 1 = 2',
    derived: false,
    seam: butt(10),
    make: withWidth('reinforcementHeight', 10, 'face'),
    limits: { D: 3.5, C: 2.5, B: 2 },
    t: 10,
  },
  {
    rowId: '1.9',
    cite: row('1.9', '502 excess weld metal, butt weld, face side'),
    src: SRC.excessMetal,
    label: 't = 3 and b = 10, one band ≥ 0.5: the same limits as at t = 10',
    derived: true,
    seam: butt(3),
    make: withWidth('reinforcementHeight', 10, 'face'),
    limits: { D: 3.5, C: 2.5, B: 2 },
    t: 3,
  },
  {
    rowId: '1.9',
    cite: row('1.9', '502 excess weld metal, butt weld, face side'),
    src: SRC.excessMetal,
    label: 'b = 60, caps govern: 16 > max 10, 10 > max 7, 7 > max 5',
    derived: true,
    seam: butt(10),
    make: withWidth('reinforcementHeight', 60, 'face'),
    limits: { D: 10, C: 7, B: 5 },
    t: 10,
  },
  // 1.10 excessive convexity of a fillet weld.
  {
    rowId: '1.10',
    cite: row('1.10', '503 excessive convexity, fillet weld'),
    src: SRC.convexity,
    label: 'b = 8: D 3, C 2.2, B 1.8',
    derived: false,
    seam: fillet(10, 5),
    make: withWidth('convexity', 8, 'face'),
    limits: { D: 3, C: 2.2, B: 1.8 },
    t: 10,
  },
  {
    rowId: '1.10',
    cite: row('1.10', '503 excessive convexity, fillet weld'),
    src: SRC.convexity,
    label: 'b = 30, caps govern: 8.5 > max 5, 5.5 > max 4, 4 > max 3',
    derived: true,
    seam: fillet(10, 5),
    make: withWidth('convexity', 30, 'face'),
    limits: { D: 5, C: 4, B: 3 },
    t: 10,
  },
  // 1.11 excess penetration (root of a butt weld).
  {
    rowId: '1.11',
    cite: row('1.11', '504 excess penetration, root side'),
    src: SRC.penetration,
    label: 't = 3.0, b = 4, band edge: D 1 + 0.6·b = 3.4, C 2.2, B 1.4',
    derived: true,
    seam: butt(3),
    make: withWidth('reinforcementHeight', 4, 'root'),
    limits: { D: 3.4, C: 2.2, B: 1.4 },
    t: 3,
  },
  {
    rowId: '1.11',
    cite: row('1.11', '504 excess penetration, root side'),
    src: SRC.penetration,
    label: 't = 3.0, b = 20: the 0.5–3 band has no cap → D 13, C 7, B 3',
    derived: true,
    seam: butt(3),
    make: withWidth('reinforcementHeight', 20, 'root'),
    limits: { D: 13, C: 7, B: 3 },
    t: 3,
  },
  {
    rowId: '1.11',
    cite: row('1.11', '504 excess penetration, root side'),
    src: SRC.penetration,
    label: 't = 3.01, b = 2, band edge: D 1 + 1.0·b = 3, C 1 + 0.6·b = 2.2, B 1 + 0.2·b = 1.4',
    derived: true,
    seam: butt(3.01),
    make: withWidth('reinforcementHeight', 2, 'root'),
    limits: { D: 3, C: 2.2, B: 1.4 },
    t: 3.01,
  },
  {
    rowId: '1.11',
    cite: row('1.11', '504 excess penetration, root side'),
    src: SRC.penetration,
    label: 't = 10, b = 15, caps govern: 16 > max 5, 10 > max 4, 4 > max 3',
    derived: true,
    seam: butt(10),
    make: withWidth('reinforcementHeight', 15, 'root'),
    limits: { D: 5, C: 4, B: 3 },
    t: 10,
  },
  // 1.12 incorrect weld toe: α ≥ the angle.
  {
    rowId: '1.12-butt',
    cite: row('1.12', '505 incorrect weld toe, butt weld'),
    src: SRC.toeButt,
    label: 'D α ≥ 90°, C α ≥ 110°, B α ≥ 150°',
    derived: false,
    seam: butt(10),
    make: atToe('toeAngle'),
    limits: { D: 90, C: 110, B: 150 },
    t: 10,
    angle: true,
  },
  {
    rowId: '1.12-fillet',
    cite: row('1.12', '505 incorrect weld toe, fillet weld'),
    src: SRC.toeFillet,
    label: 'D α ≥ 90°, C α ≥ 100°, B α ≥ 110°',
    derived: false,
    seam: fillet(10, 5),
    make: atToe('toeAngle'),
    limits: { D: 90, C: 100, B: 110 },
    t: 10,
    angle: true,
  },
  // 1.13 overlap: D h ≤ 0.2 b; C and B not permitted.
  {
    rowId: '1.13',
    cite: row('1.13', '506 overlap'),
    src: SRC.overlap,
    label: 'b = 10: D 0.2·b = 2, C and B not permitted',
    derived: false,
    seam: butt(10),
    make: (h) => reading({ overlap: h, reinforcementWidth: 10 }, { toe: { plate: 1, side: 'face' } }),
    limits: { D: 2, C: NP, B: NP },
    t: 10,
  },
  // 1.14 sagging / incompletely filled groove.
  {
    rowId: '1.14',
    cite: row('1.14', '509/511 sagging or incompletely filled groove'),
    src: SRC.sagging,
    label: 't = 3.0, band edge: D short 0.25·t = 0.75, C short 0.3, B not permitted',
    derived: true,
    seam: butt(3),
    make: onSide('sagging', 'face'),
    limits: { D: 0.75, C: 0.3, B: NP },
    t: 3,
  },
  {
    rowId: '1.14',
    cite: row('1.14', '509/511 sagging or incompletely filled groove'),
    src: SRC.sagging,
    label: 't = 3.01, band edge: D 0.7525, C 0.301, B 0.1505',
    derived: true,
    seam: butt(3.01),
    make: onSide('sagging', 'face'),
    limits: { D: 0.7525, C: 0.301, B: 0.1505 },
    t: 3.01,
  },
  {
    rowId: '1.14',
    cite: row('1.14', '509/511 sagging or incompletely filled groove'),
    src: SRC.sagging,
    label: 't = 20, caps govern: 5 > max 2, 2 > max 1, 1 > max 0.5',
    derived: true,
    seam: butt(20),
    make: onSide('sagging', 'face'),
    limits: { D: 2, C: 1, B: 0.5 },
    t: 20,
  },
  // 1.16 asymmetry of a fillet weld, h = z1 − z2 (equal legs prescribed: no nominalLegs).
  {
    rowId: '1.16',
    cite: row('1.16', '512 excessive asymmetry of fillet weld'),
    src: SRC.asymmetry,
    label: 'a = 5: D 2 + 0.2·a = 3, C 2 + 0.15·a = 2.75, B 1.5 + 0.15·a = 2.25',
    derived: false,
    seam: fillet(10, 5),
    make: (h) => reading({ leg1: typed(6 + h), leg2: 6 }),
    limits: { D: 3, C: 2.75, B: 2.25 },
    t: 10,
  },
  {
    rowId: '1.16',
    cite: row('1.16', '512 excessive asymmetry of fillet weld'),
    src: SRC.asymmetry,
    label: 'a = 10, z2 the longer leg: D 4, C 3.5, B 3',
    derived: false,
    seam: fillet(10, 10),
    make: (h) => reading({ leg1: 12, leg2: typed(12 + h) }),
    limits: { D: 4, C: 3.5, B: 3 },
    t: 10,
  },
  // 1.17 root concavity.
  {
    rowId: '1.17',
    cite: row('1.17', '515 root concavity'),
    src: SRC.concavity,
    label: 't = 3.0, band edge: D 0.2 mm + 0.1·t = 0.5, C short 0.3, B not permitted',
    derived: true,
    seam: butt(3),
    make: onSide('rootConcavity', 'root'),
    limits: { D: 0.5, C: 0.3, B: NP },
    t: 3,
  },
  {
    rowId: '1.17',
    cite: row('1.17', '515 root concavity'),
    src: SRC.concavity,
    label: 't = 3.01, band edge: D 0.602, C 0.301, B 0.1505',
    derived: true,
    seam: butt(3.01),
    make: onSide('rootConcavity', 'root'),
    limits: { D: 0.602, C: 0.301, B: 0.1505 },
    t: 3.01,
  },
  {
    rowId: '1.17',
    cite: row('1.17', '515 root concavity'),
    src: SRC.concavity,
    label: 't = 20, caps govern: 4 > max 2, 2 > max 1, 1 > max 0.5',
    derived: true,
    seam: butt(20),
    make: onSide('rootConcavity', 'root'),
    limits: { D: 2, C: 1, B: 0.5 },
    t: 20,
  },
  // 1.20 insufficient throat: h = a − aA.
  {
    rowId: '1.20',
    cite: row('1.20', '5213 insufficient throat thickness'),
    src: SRC.throatThin,
    label: 't = 3.0, a = 3, band edge: D 0.2 mm + 0.1·a = 0.5, C 0.2 mm, B not permitted',
    derived: true,
    seam: fillet(3, 3),
    make: (h) => reading({ throat: typed(3 - h) }),
    limits: { D: 0.5, C: 0.2, B: NP },
    t: 3,
  },
  {
    rowId: '1.20',
    cite: row('1.20', '5213 insufficient throat thickness'),
    src: SRC.throatThick,
    label: 't = 3.01, a = 3, band edge: D and C 0.3 mm + 0.1·a = 0.6, B not permitted',
    derived: true,
    seam: fillet(3.01, 3),
    make: (h) => reading({ throat: typed(3 - h) }),
    limits: { D: 0.6, C: 0.6, B: NP },
    t: 3.01,
  },
  {
    rowId: '1.20',
    cite: row('1.20', '5213 insufficient throat thickness'),
    src: SRC.throatThick,
    label: 't = 10, a = 20, caps govern: 0.3 + 2 = 2.3 > max 2 (D) and > max 1 (C)',
    derived: true,
    seam: fillet(10, 20),
    make: (h) => reading({ throat: typed(20 - h) }),
    limits: { D: 2, C: 1, B: NP },
    t: 10,
  },
  // 1.21 excessive throat: h = aA − a.
  {
    rowId: '1.21',
    cite: row('1.21', '5214 excessive throat thickness'),
    src: SRC.throatExcess,
    label: 'a = 5: D unlimited, C 1 + 0.2·a = 2, B 1 + 0.15·a = 1.75',
    derived: false,
    seam: fillet(10, 5),
    make: (h) => reading({ throat: typed(5 + h) }),
    limits: { D: UNLIMITED, C: 2, B: 1.75 },
    t: 10,
  },
  {
    rowId: '1.21',
    cite: row('1.21', '5214 excessive throat thickness'),
    src: SRC.throatExcess,
    label: 'a = 20, caps govern: 5 > max 4, 4 > max 3',
    derived: true,
    seam: fillet(10, 20),
    make: (h) => reading({ throat: typed(20 + h) }),
    limits: { D: UNLIMITED, C: 4, B: 3 },
    t: 10,
  },
  // 3.1 linear misalignment between plates (h = mid-plane offset, t = smaller plate).
  {
    rowId: '3.1-plates',
    cite: row('3.1', '507 linear misalignment, plates'),
    src: SRC.misalignThin,
    label: 't = 3.0, band edge: D 0.2 mm + 0.25·t = 0.95, C 0.65, B 0.5',
    derived: true,
    seam: butt(3),
    make: atSpot('linearMisalignment'),
    limits: { D: 0.95, C: 0.65, B: 0.5 },
    t: 3,
  },
  {
    rowId: '3.1-plates',
    cite: row('3.1', '507 linear misalignment, plates'),
    src: SRC.misalignThick,
    label: 't = 3.01, band edge: D 0.25·t = 0.7525, C 0.4515, B 0.301',
    derived: true,
    seam: butt(3.01),
    make: atSpot('linearMisalignment'),
    limits: { D: 0.7525, C: 0.4515, B: 0.301 },
    t: 3.01,
  },
  {
    rowId: '3.1-plates',
    cite: row('3.1', '507 linear misalignment, plates'),
    src: SRC.misalignThick,
    label: 'plates 12 and 20, t = smaller plate 12: D 3, C 1.8, B 1.2',
    derived: false,
    seam: buttSeam({ plate1: { thickness: 20 }, plate2: { thickness: 12 } }),
    make: (h) => reading({ linearMisalignment: h }, { misalignmentBasis: 'midPlane' }),
    limits: { D: 3, C: 1.8, B: 1.2 },
    t: 12,
  },
  {
    rowId: '3.1-plates',
    cite: row('3.1', '507 linear misalignment, plates'),
    src: SRC.misalignThick,
    label: 't = 40, caps govern: 10 > max 5, 6 > max 4, 4 > max 3',
    derived: true,
    seam: butt(40),
    make: atSpot('linearMisalignment'),
    limits: { D: 5, C: 4, B: 3 },
    t: 40,
  },
  // 3.1 linear misalignment, circumferential welds: h ≤ 0.5 t, max 4 / 3 / 2.
  {
    rowId: '3.1-circumferential',
    cite: row('3.1', '507 linear misalignment, circumferential weld'),
    src: SRC.misalignThick,
    label: 't = 3: 0.5·t = 1.5 at every level (below every cap)',
    derived: false,
    seam: butt(3, { circumferential: true }),
    make: atSpot('linearMisalignment'),
    limits: { D: 1.5, C: 1.5, B: 1.5 },
    t: 3,
  },
  {
    rowId: '3.1-circumferential',
    cite: row('3.1', '507 linear misalignment, circumferential weld'),
    src: SRC.misalignThick,
    label: 't = 5: 0.5·t = 2.5 for D and C, B capped at 2',
    derived: true,
    seam: butt(5, { circumferential: true }),
    make: atSpot('linearMisalignment'),
    limits: { D: 2.5, C: 2.5, B: 2 },
    t: 5,
  },
  {
    rowId: '3.1-circumferential',
    cite: row('3.1', '507 linear misalignment, circumferential weld'),
    src: SRC.misalignThick,
    label: 't = 12, caps govern: 6 > max 4, 3, 2',
    derived: true,
    seam: butt(12, { circumferential: true }),
    make: atSpot('linearMisalignment'),
    limits: { D: 4, C: 3, B: 2 },
    t: 12,
  },
  // 3.2 incorrect root gap, fillet weld.
  {
    rowId: '3.2',
    cite: row('3.2', '617 incorrect root gap, fillet weld'),
    src: SRC.gapThin,
    label: 't = 3.0, a = 3, band edge: D 0.5 + 0.1·a = 0.8, C 0.6, B 0.5',
    derived: true,
    seam: fillet(3, 3),
    make: atSpot('rootGap'),
    limits: { D: 0.8, C: 0.6, B: 0.5 },
    t: 3,
  },
  {
    rowId: '3.2',
    cite: row('3.2', '617 incorrect root gap, fillet weld'),
    src: SRC.gapThick,
    label: 't = 3.01, a = 3, band edge: D 1 + 0.3·a = 1.9, C 0.5 + 0.2·a = 1.1, B 0.5 + 0.1·a = 0.8',
    derived: true,
    seam: fillet(3.01, 3),
    make: atSpot('rootGap'),
    limits: { D: 1.9, C: 1.1, B: 0.8 },
    t: 3.01,
  },
  {
    rowId: '3.2',
    cite: row('3.2', '617 incorrect root gap, fillet weld'),
    src: SRC.gapThick,
    label: 't = 10, a = 12: D capped (4.6 > max 4), C 2.9 and B 1.7 below their caps',
    derived: true,
    seam: fillet(10, 12),
    make: atSpot('rootGap'),
    limits: { D: 4, C: 2.9, B: 1.7 },
    t: 10,
  },
  {
    rowId: '3.2',
    cite: row('3.2', '617 incorrect root gap, fillet weld'),
    src: SRC.gapThick,
    label: 't = 10, a = 20, caps govern: 7 > max 4, 4.5 > max 3, 2.5 > max 2',
    derived: true,
    seam: fillet(10, 20),
    make: atSpot('rootGap'),
    limits: { D: 4, C: 3, B: 2 },
    t: 10,
  },
];

const TESTS = CASES.flatMap((c) =>
  LEVELS.map((level) => ({
    name:
      `${c.cite}, ${c.label}; level ${level} (limits reference §2, ${c.src[level]})` +
      (c.derived ? '; boundary derived from the table' : ''),
    c,
    level,
  })),
);

describe('ISO 5817:2014 Table 1, row by row', () => {
  // '%s' prints the whole name (a '$name' template is cut short), so each source stays readable in the report.
  it.each(TESTS.map((x) => [x.name, x] as const))('%s', (_name, { c, level }) => {
    const limit = c.limits[level];
    const seam = requiring(c.seam, level);
    if (limit === UNLIMITED) {
      // "Unlimited": any excess meets the level, and there is no governing value or margin.
      const huge = 50;
      const g = rowGradeOf(seam, c.make(huge), c.rowId);
      expect(g.governing.level).toBe(level);
      expect(g.governing.value).toBeNull();
      expect(g.governing.passes).toBe(true);
      expect(g.margin).toBeNull();
      expect(g.meetsRequired).toBe(true);
      expect(g.levelMet).toBe(expectedLevel(huge, c.limits));
      return;
    }
    const on = limit;
    const past = typed(c.angle ? limit - 0.01 : limit + 0.01);

    const gOn = rowGradeOf(seam, c.make(on), c.rowId);
    expect(gOn.thicknessMm).toBe(c.t);
    expect(gOn.required).toBe(level);
    expect(gOn.governing.level).toBe(level);
    expect(gOn.governing.value).toBe(limit);
    expect(gOn.governing.passes).toBe(true);
    expect(gOn.margin).toBe(0);
    expect(gOn.meetsRequired).toBe(true);
    expect(gOn.levelMet).toBe(expectedLevel(on, c.limits, c.angle));

    // An angle below 90° is outside the physical range the validator accepts, so that one is graded unchecked.
    const gPast = rowGradeOf(seam, c.make(past), c.rowId, undefined, !(c.angle && past < 90));
    expect(gPast.governing.value).toBe(limit);
    expect(gPast.governing.passes).toBe(false);
    expect(gPast.margin).toBe(-0.01);
    expect(gPast.meetsRequired).toBe(false);
    expect(gPast.levelMet).toBe(expectedLevel(past, c.limits, c.angle));
  });

  it('covers every row of the built-in 2014 table, on both sides of t = 3 where the row has two bands', () => {
    for (const r of ISO5817_2014_ROWS) {
      const cases = CASES.filter((c) => c.rowId === r.id);
      expect(cases.length, r.id).toBeGreaterThan(0);
      if (r.bands.length === 2) {
        expect(
          cases.some((c) => c.t === 3),
          `${r.id} at t = 3.0`,
        ).toBe(true);
        expect(
          cases.some((c) => c.t > 3),
          `${r.id} above 3`,
        ).toBe(true);
      }
    }
    expect(new Set(CASES.map((c) => c.rowId))).toEqual(new Set(ISO5817_2014_ROWS.map((r) => r.id)));
  });
});
