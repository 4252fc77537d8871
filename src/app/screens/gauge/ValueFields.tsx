import { PARAMETERS, UNIT_LABEL, type ParameterName, type Seam, type Side } from '../../../domain/index.js';
import { NumberField } from '../../components/NumberField.js';
import { fieldLabel } from './field-labels.js';
import { AngularMisalignmentFields, LinearMisalignmentFields } from './MisalignmentFields.js';
import type { AngularEntry, LinearEntry } from './misalignment-entry.js';
import type { FieldProblems } from './reading-builder.js';

const HINTS: Partial<Record<ParameterName, string>> = {
  toeAngle: 'through the weld, 90° to 180° (flush = 180°)',
  toeRadius: 'more than 0',
  reinforcementWidth: 'in the same cross-section as the height',
  throat: 'the actual throat measured here',
  poreDiameter: 'largest dimension of the largest surface pore here',
};

/** The value fields of the instrument in the hand, stepping by its resolution. */
export function ValueFields(props: {
  readonly seam: Seam;
  readonly fields: readonly ParameterName[];
  readonly side: Side;
  readonly values: Readonly<Partial<Record<ParameterName, number>>>;
  readonly onValue: (name: ParameterName, v: number | undefined) => void;
  readonly linear: LinearEntry;
  readonly onLinear: (e: LinearEntry) => void;
  readonly angular: AngularEntry;
  readonly onAngular: (e: AngularEntry) => void;
  readonly resolutionMm: number;
  readonly resolutionDeg: number;
  readonly problems: FieldProblems;
}) {
  const { seam, fields, side, problems } = props;
  return (
    <div class="gauge-values">
      {fields.map((name) => {
        if (name === 'linearMisalignment') {
          return (
            <LinearMisalignmentFields
              key={name}
              seam={seam}
              entry={props.linear}
              onChange={props.onLinear}
              step={props.resolutionMm}
              error={problems.linearMisalignment}
              basisError={problems.misalignmentBasis}
            />
          );
        }
        if (name === 'angularMisalignment') {
          return (
            <AngularMisalignmentFields
              key={name}
              entry={props.angular}
              onChange={props.onAngular}
              step={props.resolutionDeg}
              error={problems.angularMisalignment}
            />
          );
        }
        const p = PARAMETERS[name];
        return (
          <NumberField
            key={name}
            name={name}
            label={fieldLabel(name, seam, side)}
            unit={UNIT_LABEL[p.unit]}
            step={p.unit === 'deg' ? props.resolutionDeg : props.resolutionMm}
            min={p.min}
            max={p.max}
            value={props.values[name]}
            onChange={(v) => props.onValue(name, v)}
            {...(HINTS[name] ? { hint: HINTS[name] } : {})}
            error={problems[name]}
          />
        );
      })}
    </div>
  );
}
