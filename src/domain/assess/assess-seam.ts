import { INDICATIVE_CAUTION } from '../caution.js';
import { coveredRowOf } from '../fatigue/select.js';
import type { SeamGrade } from '../grade/seam.js';
import { KM_COVERED, type CoveredRow } from '../misalignment/covered.js';
import type { SeamFile } from '../model/seam-file.js';
import { bendingOf } from './bending.js';
import { classChoice, effectiveNotchSection, fatigueSection } from './fatigue-section.js';
import { misalignmentSection } from './misalignment-section.js';
import { misalignmentInputs, roundReadings } from './readings.js';
import { samplingSection } from './sampling-section.js';
import { sensitivitySection } from './sensitivity.js';
import { setupOf, type AssessOptions } from './setup.js';
import { pickToes, rankToes } from './toes.js';
import type { SeamAssessment } from './types.js';

function defaultCovered(file: SeamFile): CoveredRow | null {
  const { joint } = file.seam;
  if (joint.type === 'butt') return joint.setting === 'shopFlat' ? 'buttShopFlat' : 'buttOther';
  if (joint.type === 'cruciform') return 'cruciform';
  if (joint.type === 'filletT') return 'filletOneSurface';
  return null;
}

/**
 * What the measured geometry does to the fatigue strength the designer assumed: km from misalignment, Kt per
 * toe with the most likely crack site, the FAT flag and an indicative life, an effective-notch cross-check, the
 * sensitivity to each reading, and whether enough positions were measured. A plain, serialisable object; every
 * part carries the caution and names what it assumed. Pure: the same file and grade give the same assessment.
 */
export function assessSeam(file: SeamFile, grade: SeamGrade, options: AssessOptions = {}): SeamAssessment {
  const setup = setupOf(file.seam, options);
  const { round, readings, note } = roundReadings(file, grade);
  const mis = misalignmentInputs(setup, readings);
  const bending = bendingOf(setup, mis);
  const choice = classChoice(setup, readings);
  const governingId = choice.ids[0];
  const covered = governingId !== undefined ? coveredRowOf(governingId, file.seam) : defaultCovered(file);
  const misalignment = misalignmentSection(setup, mis, bending, covered);
  const measured = misalignment.kmCalc !== null || misalignment.state === 'partial';
  const { picks, notRanked } = pickToes(setup, readings, bending);
  const toes = rankToes(setup, picks, bending, notRanked, mis.eHi !== null || mis.aHi !== null);
  const fatigue = fatigueSection(setup, choice, misalignment);
  const effectiveNotch = effectiveNotchSection(setup, picks, bending, fatigue, measured);
  const sensitivity =
    options.sensitivity === false
      ? {
          caution: INDICATIVE_CAUTION,
          assumptions: ['not asked for'],
          rankedBy: 'toe factor' as const,
          rows: [],
        }
      : sensitivitySection(setup, mis, picks, {
          kmMeasured: misalignment.kmCalc !== null,
          covered: covered ? KM_COVERED[covered].value : null,
          fatTimesThickness: fatigue.governing
            ? fatigue.governing.fat * fatigue.governing.thicknessFactor
            : null,
          stressRange: file.seam.fatigue?.designStressRange ?? null,
        });
  const assumptions = [...setup.assumptions];
  if (note) assumptions.push(note);
  if (round === null) assumptions.push('no readings: nothing measured to assess');
  return {
    format: 'beadbook.assessment/1',
    seamId: file.seam.id,
    round,
    caution: INDICATIVE_CAUTION,
    assumptions,
    misalignment,
    toes:
      fatigue.governing && fatigue.governing.crackAt !== 'toe'
        ? {
            ...toes,
            note: [
              toes.note,
              `the governing class ${fatigue.governing.id} puts the crack at the ${fatigue.governing.crackAt}, not at a toe`,
            ]
              .filter(Boolean)
              .join('; '),
          }
        : toes,
    fatigue,
    effectiveNotch,
    sensitivity,
    sampling: samplingSection(setup, grade, round, readings, options),
  };
}
