// What the seam screen's assessment panel says, as plain data: every number already worded for an inspector,
// so the panel only lays it out and the wording is tested without a browser.
import type {
  DetailId,
  FatFlag,
  LifeEstimate,
  MisalignmentAssessment,
  SeamAssessment,
  SensitivityRow,
} from '../../domain/index.js';
import { fmtNumber } from './format.js';

export interface Fact {
  readonly label: string;
  readonly value: string;
  readonly note?: string;
}

export interface KmView {
  /** One line each: linear, angular, combined, covered by the class, km,eff, and the DNV form beside. */
  readonly facts: readonly Fact[];
  readonly summary: string;
  readonly assumptions: readonly string[];
}

export interface ToeRow {
  readonly rank: number;
  readonly label: string;
  readonly where: string;
  readonly factor: string;
  readonly bending: string;
  readonly flags: readonly string[];
}

export interface ToesView {
  readonly rows: readonly ToeRow[];
  readonly crackSite: string | null;
  readonly notRanked: readonly string[];
  readonly note: string | null;
}

export interface FatView {
  readonly flag: FatFlag;
  /** A shape that repeats the verdict, so it never rests on colour alone. */
  readonly symbol: string;
  readonly verdict: string;
  readonly numbers: string;
  readonly chosen: string;
  readonly chosenId: DetailId | null;
  readonly why: readonly string[];
  readonly missing: readonly string[];
  /** Whether the seam's set-up can carry an engineer's choice of detail (it has fatigue data). */
  readonly canOverride: boolean;
  readonly overrideId: DetailId | null;
  readonly effectiveNotch: string;
  readonly life: string;
  readonly lifeCurve: string | null;
}

export interface Bar {
  readonly label: string;
  /** Bar length in the chart's quantity (relative life change, or change of Kt). */
  readonly magnitude: number;
  readonly text: string;
}

export interface DriversView {
  readonly title: string;
  readonly bars: readonly Bar[];
  readonly toeBars: readonly Bar[];
  readonly unaffected: readonly string[];
}

export interface SamplingRow {
  readonly label: string;
  readonly unit: 'mm' | 'deg';
  readonly advice: string;
  readonly settled: boolean;
  readonly positions: readonly number[];
  readonly means: readonly number[];
  /** Half-width the 95 % interval should reach (default: the instrument resolution). */
  readonly target: number;
}

export interface AssessmentView {
  readonly caution: string;
  readonly round: number | null;
  readonly assumptions: readonly string[];
  readonly km: KmView;
  readonly toes: ToesView;
  readonly fat: FatView;
  readonly drivers: DriversView;
  readonly sampling: { readonly caveat: string; readonly rows: readonly SamplingRow[] };
}

const n3 = (x: number): string => fmtNumber(Number(x.toPrecision(3)), 6);
const n4 = (x: number): string => fmtNumber(Number(x.toPrecision(4)), 6);
const unitText = (unit: 'mm' | 'deg'): string => (unit === 'deg' ? '°' : ' mm');
const cycles = (x: number): string =>
  !Number.isFinite(x) ? 'unlimited' : x >= 1e5 ? `${n3(x / 1e6)} million` : fmtNumber(Math.round(x), 0);

const FLAG_SYMBOL: Record<FatFlag, string> = { meets: '✓', below: '✗', notAssessable: '?' };
const FLAG_WORDS: Record<FatFlag, string> = {
  meets: 'Meets the required fatigue class',
  below: 'Below the required fatigue class',
  notAssessable: 'Not assessable',
};

function kmFacts(m: MisalignmentAssessment): Fact[] {
  const out: Fact[] = [];
  if (m.linear && 'notAssessed' in m.linear) out.push({ label: 'km linear', value: m.linear.notAssessed });
  else if (m.linear)
    out.push({ label: 'km linear', value: n4(Math.max(...m.linear.kmByPlate)), note: m.linear.formula });
  if (m.angular && 'notAssessed' in m.angular)
    out.push({ label: 'km angular', value: m.angular.notAssessed });
  else if (m.angular)
    out.push({ label: 'km angular', value: n4(Math.max(...m.angular.kmByPlate)), note: m.angular.formula });
  if (m.kmCalc !== null) {
    const at = m.governingSurface
      ? `at the plate ${m.governingSurface.plate} ${m.governingSurface.surface} surface`
      : undefined;
    out.push({ label: 'km combined', value: n4(m.kmCalc), ...(at ? { note: at } : {}) });
  }
  if (m.kmCovered)
    out.push({ label: 'km covered by the class', value: n3(m.kmCovered.value), note: m.kmCovered.label });
  if (m.kmEff !== null)
    out.push({ label: 'km,eff', value: n4(m.kmEff), note: 'km combined ÷ km covered, never below 1' });
  if (m.dnv) out.push({ label: 'DNV form (second estimate)', value: n4(m.dnv.scf), note: m.dnv.formula });
  return out;
}

function kmSummary(m: MisalignmentAssessment): string {
  if (m.kmCalc !== null && m.kmEff !== null)
    return `km ${n4(m.kmCalc)}; after what the class already covers, km,eff ${n4(m.kmEff)}.`;
  if (m.kmCalc !== null) return `km ${n4(m.kmCalc)}.`;
  if (m.state === 'notApplicable') return 'km does not apply to this joint.';
  const missing = m.missing.length ? ` Missing: ${m.missing.join('; ')}.` : '';
  return m.state === 'notMeasured' ? `No misalignment measured yet.${missing}` : `km not assessed.${missing}`;
}

function toesView(a: SeamAssessment): ToesView {
  const rows = a.toes.toes.map((t): ToeRow => {
    const r = t.range;
    const flags: string[] = [];
    if (r?.extrapolated) flags.push('outside every formula’s range');
    if (t.governing.radiusBasis !== 'measured') flags.push('radius not measured here');
    return {
      rank: t.rank,
      label: t.label,
      where: `${fmtNumber(t.governing.position)} mm (${t.governing.readingId})`,
      factor: r ? (r.min === r.max ? n4(r.max) : `${n4(r.min)} to ${n4(r.max)}`) : '—',
      bending:
        t.secondaryBending === 'none'
          ? 'no secondary bending'
          : `secondary bending in ${t.secondaryBending} (b = ${t.bendingRatio >= 0 ? '+' : '−'}${n3(Math.abs(t.bendingRatio))})`,
      flags,
    };
  });
  const c = a.toes.crackSite;
  return {
    rows,
    crackSite: c
      ? `Most likely crack site: ${c.label} at ${fmtNumber(c.position)} mm (Kt,eff ${n4(c.factor)}) — ${c.why}`
      : null,
    notRanked: a.toes.notRanked.map((x) => x.reason),
    note: a.toes.note,
  };
}

function lifeText(life: LifeEstimate | { readonly notAssessed: string }): string {
  if ('notAssessed' in life) return `Life not estimated: ${life.notAssessed}.`;
  const req =
    life.requiredCycles === null
      ? ''
      : `, against ${cycles(life.requiredCycles)} required — ${life.meets ? 'meets it' : 'does not meet it'}`;
  return `About ${cycles(life.cycles)} cycles at a stress range of ${n3(life.stressRange)} MPa${req} (indicative).`;
}

function fatView(a: SeamAssessment, canOverride: boolean): FatView {
  const f = a.fatigue;
  const g = f.governing;
  const numbers =
    f.fatEquivalent !== null && f.requiredFat
      ? `FAT equivalent ${n3(f.fatEquivalent)} MPa against the required ${n3(f.requiredFat.value)} MPa (${f.requiredFat.basis})`
      : f.fatEquivalent !== null
        ? `FAT equivalent ${n3(f.fatEquivalent)} MPa`
        : 'No FAT equivalent yet';
  const chosen = g
    ? `Detail ${g.id}: ${g.title}, FAT ${g.fat} MPa${g.thicknessFactor < 1 ? ` × thickness factor ${n3(g.thicknessFactor)}` : ''} (${g.fatSource})`
    : 'No catalogue detail fits this seam';
  const why = [...f.earned.why];
  if (f.override?.detail) why.unshift(`detail ${f.override.detail} chosen by an engineer`);
  if (f.override?.fat) why.unshift(`FAT ${f.override.fat} MPa chosen by an engineer`);
  if (f.designDetail?.note) why.push(f.designDetail.note);
  const en = a.effectiveNotch;
  return {
    flag: f.flag,
    symbol: FLAG_SYMBOL[f.flag],
    verdict: FLAG_WORDS[f.flag],
    numbers,
    chosen,
    chosenId: g?.id ?? null,
    why,
    missing: f.missing,
    canOverride,
    overrideId: f.override?.detail ?? null,
    effectiveNotch: `Effective-notch cross-check (${en.basis}): ${
      en.fatEquivalent !== null ? `FAT equivalent ${n3(en.fatEquivalent)} MPa` : 'not rated'
    } — ${FLAG_WORDS[en.flag].toLowerCase()}${en.missing.length ? ` (missing: ${en.missing.join('; ')})` : ''}.`,
    life: lifeText(f.life),
    lifeCurve: 'notAssessed' in f.life ? null : f.life.curve,
  };
}

const where = (r: SensitivityRow): string => `${r.input}, ${r.where}`;

function driversView(a: SeamAssessment): DriversView {
  const s = a.sensitivity;
  const byLife = s.rankedBy === 'life';
  const bars = byLife
    ? s.rows
        .filter((r) => r.magnitude > 0)
        .map((r) => ({
          label: where(r),
          magnitude: r.magnitude,
          text: `±${r.uncertainty}${unitText(r.unit)} → life ±${n3(100 * r.magnitude)} %`,
        }))
    : [];
  const toeBars = [...s.rows]
    .filter((r) => r.toeMagnitude > 0)
    .sort((x, y) => y.toeMagnitude - x.toeMagnitude)
    .map((r) => ({
      label: where(r),
      magnitude: r.toeMagnitude,
      text: `±${r.uncertainty}${unitText(r.unit)} → Kt ±${n3(r.toeMagnitude)}`,
    }));
  return {
    title: byLife ? 'What drives the life' : 'What drives the toe factors',
    bars,
    toeBars,
    unaffected: s.rows.filter((r) => r.magnitude === 0 && r.toeMagnitude === 0).map(where),
  };
}

/** The panel's content from the worker's assessment; `canOverride` when the seam's set-up has fatigue data. */
export function assessmentView(a: SeamAssessment, canOverride: boolean): AssessmentView {
  return {
    caution: a.caution,
    round: a.round,
    assumptions: a.assumptions,
    km: {
      facts: kmFacts(a.misalignment),
      summary: kmSummary(a.misalignment),
      assumptions: a.misalignment.assumptions,
    },
    toes: toesView(a),
    fat: fatView(a, canOverride),
    drivers: driversView(a),
    sampling: {
      caveat: a.sampling.caveat,
      rows: a.sampling.parameters.map((p) => ({
        label: p.label,
        unit: p.unit,
        advice: p.advice,
        settled: p.settled,
        positions: p.runningMean.positions,
        means: p.runningMean.means,
        target: p.target.value,
      })),
    },
  };
}
