import type { JointFamily } from './parameters.js';
import type { JointType, Reading, Seam, Side } from './seam-file.js';

export const jointFamily = (type: JointType): JointFamily => (type === 'butt' ? 'butt' : 'fillet');

export const smallerThickness = (seam: Seam): number =>
  Math.min(seam.plate1.thickness, seam.plate2.thickness);

/** The side a reading sits on: its toe's side, or the side it names. */
export const readingSide = (r: Reading): Side | undefined => r.toe?.side ?? r.side;

/**
 * Mid-plane offset e from what a misalignment gauge read. Plate 1's mid-plane is the datum and the face side
 * is positive, so the face surfaces sit at t1/2 and e + t2/2, the root surfaces at −t1/2 and e − t2/2
 * (geometry of the joint cross-section, common practice).
 */
export function midPlaneOffset(
  read: number,
  basis: 'midPlane' | 'faceSurface' | 'rootSurface',
  t1: number,
  t2: number,
): number {
  if (basis === 'faceSurface') return read - (t2 - t1) / 2;
  if (basis === 'rootSurface') return read + (t2 - t1) / 2;
  return read;
}
