// Units a scanner may write, and the factors to the record's millimetres and degrees.

export const LENGTH_UNITS = ['mm', 'um', 'inch', 'm'] as const;
export const ANGLE_UNITS = ['deg', 'rad'] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];
export type AngleUnit = (typeof ANGLE_UNITS)[number];
export type ImportUnit = LengthUnit | AngleUnit;

export const UNIT_FACTOR: Readonly<Record<ImportUnit, number>> = {
  mm: 1,
  um: 0.001,
  inch: 25.4,
  m: 1000,
  deg: 1,
  rad: 180 / Math.PI,
};

export const isAngleUnit = (u: ImportUnit): u is AngleUnit => u === 'deg' || u === 'rad';

/** The unit a header or units-row cell names, e.g. "Height [mm]", "angle (rad)", "h_um", "µm", "°". */
export function unitInText(text: string): ImportUnit | null {
  const t = text.trim().toLowerCase();
  const bracket = /[[(]\s*([^\])]+?)\s*[\])]\s*$/.exec(t)?.[1];
  const suffix = /[ _-](mm|um|µm|μm|in|inch|inches|deg|degrees?|rad|radians?|m)$/.exec(t)?.[1];
  const word = bracket ?? suffix ?? t;
  switch (word) {
    case 'mm':
    case 'millimetres':
    case 'millimeters':
      return 'mm';
    case 'um':
    case 'µm':
    case 'μm':
    case 'micron':
    case 'microns':
      return 'um';
    case 'in':
    case 'inch':
    case 'inches':
    case '"':
      return 'inch';
    case 'm':
      return 'm';
    case 'deg':
    case 'degree':
    case 'degrees':
    case '°':
      return 'deg';
    case 'rad':
    case 'radian':
    case 'radians':
      return 'rad';
    default:
      return null;
  }
}
