import type { Seam } from '../../domain/index.js';
import { fmtNumber, JOINT_LABEL, PREPARATION_LABEL, SETTING_LABEL, SURFACE_LABEL } from './format.js';
import { requiredText } from './required-level.js';

/** The seam's set-up as label and value pairs: the Seam screen's summary, and the supervisor's pages. */
export function setupRows(seam: Seam): [string, string][] {
  const j = seam.joint;
  const rows: [string, string][] = [
    [
      'Joint',
      [
        JOINT_LABEL[j.type],
        j.preparation ? (PREPARATION_LABEL[j.preparation] ?? j.preparation) : null,
        j.sides === 'one' ? 'one-sided' : 'two-sided',
        SETTING_LABEL[j.setting] ?? j.setting,
      ]
        .filter(Boolean)
        .join(', ') + (j.faceSideNote ? ` (face: ${j.faceSideNote})` : ''),
    ],
    ['Plate 1 (loaded / main)', `t1 = ${fmtNumber(seam.plate1.thickness)} mm`],
    ['Plate 2', `t2 = ${fmtNumber(seam.plate2.thickness)} mm`],
  ];
  if (seam.buttThickness !== undefined)
    rows.push(['Butt-weld thickness', `s = ${fmtNumber(seam.buttThickness)} mm`]);
  if (seam.nominalThroat !== undefined)
    rows.push(['Nominal throat', `a = ${fmtNumber(seam.nominalThroat)} mm`]);
  if (seam.nominalLegs)
    rows.push([
      'Nominal legs',
      `z1 = ${fmtNumber(seam.nominalLegs.leg1)} mm, z2 = ${fmtNumber(seam.nominalLegs.leg2)} mm`,
    ]);
  rows.push(
    ['Length', `${fmtNumber(seam.length)} mm${seam.circumferential ? ', circumferential' : ''}`],
    ['Surface', SURFACE_LABEL[seam.surface] ?? seam.surface],
    [
      'Material',
      `${seam.material.name}${seam.material.group ? `, group ${seam.material.group}` : ''} (${seam.material.kind})`,
    ],
    ['Required', requiredText(seam)],
    ['Edition', seam.acceptance.edition],
  );
  if (seam.process) rows.push(['Process', seam.process]);
  if (seam.welder) rows.push(['Welder', seam.welder]);
  if (seam.procedure) rows.push(['Procedure (WPS)', seam.procedure]);
  return rows;
}
