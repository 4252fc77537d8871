import { INDICATIVE_CAUTION } from '../caution.js';
import { dnvButtScf, dnvCruciformScf, dnvThicknessTransitionScf } from '../misalignment/axial.js';
import { KM_COVERED, kmEffective, type CoveredRow } from '../misalignment/covered.js';
import {
  deltaAngular,
  deltaAxial,
  surfacesOf,
  type BendingState,
  type Measured,
  type MisalignmentInputs,
} from './bending.js';
import type { Setup } from './setup.js';
import type { Governing, MisalignmentAssessment } from './types.js';

const governing = (m: Measured, unit: 'mm' | 'deg'): Governing => ({
  readingId: m.readingId,
  position: m.position,
  value: m.value,
  unit,
});

const largest = (a: Measured | null, b: Measured | null): number =>
  Math.max(Math.abs(a?.value ?? 0), Math.abs(b?.value ?? 0));

function linearOf(setup: Setup, mis: MisalignmentInputs): MisalignmentAssessment['linear'] {
  if (!mis.eHi || !mis.eLo) return null;
  if (setup.joint === 'filletT' || setup.joint === 'lap') {
    return {
      notAssessed:
        setup.joint === 'lap'
          ? 'lap joints are eccentric by design: no misalignment formula in the reference'
          : 'the main plate of a T joint is continuous: linear misalignment puts no secondary bending in it',
    };
  }
  const e = largest(mis.eHi, mis.eLo);
  const stepped = setup.joint === 'butt' && Math.abs(setup.t1 - setup.t2) > 1e-9;
  const formula = stepped
    ? '1 + (6e/t_i)·t_i^1.5/(t1^1.5 + t2^1.5), e the mid-plane offset (remote, unrestrained)'
    : setup.joint === 'cruciform'
      ? '1 + λ·(e/t)·l_i/(l1 + l2), λ = 6, the larger arm share (the halves of the loaded plate are not told apart)'
      : `1 + λ·(e/t)·l_i/(l1 + l2), λ = 6${setup.restraint === 'clamped' ? ', share at least ½ with clamped ends' : ''}`;
  return {
    highest: governing(mis.eHi, 'mm'),
    lowest: governing(mis.eLo, 'mm'),
    formula,
    source:
      setup.joint === 'cruciform'
        ? 'IIW Recommendations 2016, App. 6.3, cruciform joints (recalled, low confidence)'
        : 'IIW Recommendations 2016, App. 6.3; BS 7910 Annex D (recalled)',
    kmByPlate: [1 + deltaAxial(setup, 1, e), 1 + deltaAxial(setup, 2, e)],
  };
}

function angularOf(setup: Setup, mis: MisalignmentInputs): MisalignmentAssessment['angular'] {
  if (!mis.aHi || !mis.aLo) return null;
  if (setup.joint === 'lap') return { notAssessed: 'lap joints: no angular formula in the reference' };
  const a = largest(mis.aHi, mis.aLo);
  const d1 = deltaAngular(setup, 1, a);
  const d2 = deltaAngular(setup, 2, a);
  if (!('delta' in d1)) return { notAssessed: d1.notAssessed };
  return {
    highest: governing(mis.aHi, 'deg'),
    lowest: governing(mis.aLo, 'deg'),
    formula: d1.formula,
    source:
      'BS 7910 Annex D; IIW Recommendations 2016, App. 6.3 (tanh forms checked by a beam-column solution)',
    kmByPlate: [1 + d1.delta, 1 + ('delta' in d2 ? d2.delta : d1.delta)],
    straighteningFactor: d1.factor,
  };
}

function dnvOf(setup: Setup, mis: MisalignmentInputs): MisalignmentAssessment['dnv'] {
  if (!mis.eHi || !mis.eLo) return null;
  const e = largest(mis.eHi, mis.eLo);
  const note = 'linear misalignment only, δ0 = 0.1·t already in the S-N data subtracted; floored at 1';
  if (setup.joint === 'butt') {
    const t = Math.min(setup.t1, setup.t2);
    const T = Math.max(setup.t1, setup.t2);
    const stepped = T - t > 1e-9;
    return {
      scf: Math.max(1, stepped ? dnvThicknessTransitionScf(e, t, T) : dnvButtScf(e, t)),
      formula: stepped ? '1 + 6·(δt + δm − δ0)/(t·[1 + (T/t)^1.5])' : '1 + 3·(δm − δ0)/t',
      source: 'DNV-RP-C203 (2016) Sec. 3.1 (recalled)',
      note,
    };
  }
  if (setup.joint === 'cruciform') {
    const lt = Math.max(setup.l1, setup.l2);
    const lT = Math.min(setup.l1, setup.l2);
    return {
      scf: Math.max(1, dnvCruciformScf(e, setup.t1, lt, lT)),
      formula: '1 + 6·δ·l_t/(t·(l_t + l_T))',
      source: 'DNV-RP-C203, cruciform joints (recalled, low confidence)',
      note: 'no δ0 subtracted in this form; floored at 1',
    };
  }
  return null;
}

/** The km part of the assessment: each misalignment's km, their combination per surface and km,eff. */
export function misalignmentSection(
  setup: Setup,
  mis: MisalignmentInputs,
  bending: BendingState,
  covered: CoveredRow | null,
): MisalignmentAssessment {
  const linear = linearOf(setup, mis);
  const angular = angularOf(setup, mis);
  const surfaces = surfacesOf(setup.joint).map((s, i) => {
    const b = bending.b[i] ?? 0;
    // Spelt out rather than spread: copying by spread was a measurable share of the assessment.
    return {
      plate: s.plate,
      surface: s.surface,
      bendingRatio: b,
      km: 1 + b,
      state: b > 0 ? 'tension' : b < 0 ? 'compression' : 'none',
    } as const;
  });
  const missing: string[] = [];
  const assumptions = [...setup.assumptions];
  const measured = linear !== null || angular !== null;
  if (!measured) missing.push('linearMisalignment or angularMisalignment readings');
  if (angular && 'notAssessed' in angular) missing.push(`angular km: ${angular.notAssessed}`);
  if (measured && !linear && setup.joint !== 'filletT')
    assumptions.push('linear misalignment not measured: taken as zero');
  if (measured && !angular) assumptions.push('angular misalignment not measured: taken as zero');
  assumptions.push(
    'the largest linear and the largest angular misalignment are combined at each surface, wherever measured',
  );
  let state: MisalignmentAssessment['state'];
  if (setup.joint === 'lap') state = 'notApplicable';
  else if (!measured) state = 'notMeasured';
  else if (missing.length) state = linear && !('notAssessed' in linear) ? 'partial' : 'notAssessable';
  else state = 'assessed';
  let gi = -1;
  surfaces.forEach((s, i) => {
    if (gi < 0 || s.bendingRatio > (surfaces[gi] as (typeof surfaces)[number]).bendingRatio) gi = i;
  });
  const top = surfaces[gi];
  const kmCalc = state === 'assessed' && top ? 1 + Math.max(0, top.bendingRatio) : null;
  const row = covered ? KM_COVERED[covered] : null;
  return {
    caution: INDICATIVE_CAUTION,
    state,
    missing,
    assumptions,
    linear,
    angular,
    surfaces,
    kmCalc,
    governingSurface: kmCalc !== null && top ? { plate: top.plate, surface: top.surface } : null,
    kmCovered:
      row && covered
        ? {
            value: row.value,
            row: covered,
            label: row.label,
            source: 'IIW Recommendations §3.8.2 table (recalled)',
          }
        : null,
    kmEff: kmCalc !== null && row ? kmEffective(kmCalc, row.value) : null,
    dnv: dnvOf(setup, mis),
  };
}
