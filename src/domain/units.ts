/** Lengths are stored in millimetres and angles in degrees everywhere in the record. */
export type Millimetres = number;
export type Degrees = number;

export type Unit = 'mm' | 'deg';

export const UNIT_LABEL: Record<Unit, string> = { mm: 'mm', deg: '°' };
