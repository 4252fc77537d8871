import { jointFamily, type ParameterName, type Seam, type Side, type Toe } from '../../../domain/index.js';

/** Field names in the inspector's words; the symbol follows the standard's letter. */
export function fieldLabel(name: ParameterName, seam: Seam, side?: Side): string {
  const butt = jointFamily(seam.joint.type) === 'butt';
  const attachment = seam.joint.type === 'lap' ? 'plate 2' : 'attachment';
  const main = seam.joint.type === 'lap' ? 'plate 1' : 'main plate';
  switch (name) {
    case 'toeAngle':
      return 'Toe angle α';
    case 'toeRadius':
      return 'Toe radius ρ';
    case 'reinforcementHeight':
      return side === 'root' ? 'Root bead height h' : 'Cap height h';
    case 'reinforcementWidth':
      if (!butt) return 'Fillet face width b';
      return side === 'root' ? 'Root bead width b' : 'Cap width b';
    case 'convexity':
      return 'Face convexity h';
    case 'undercutDepth':
      return 'Undercut depth h';
    case 'overlap':
      return 'Overlap h';
    case 'rootConcavity':
      return 'Root concavity h';
    case 'shrinkageGroove':
      return 'Shrinkage groove h';
    case 'sagging':
      return 'Sagging h';
    case 'incompleteRootPenetration':
      return 'Incomplete root penetration h';
    case 'throat':
      return 'Throat a';
    case 'leg1':
      return `Leg on ${main} z1`;
    case 'leg2':
      return `Leg on ${attachment} z2`;
    case 'rootGap':
      return 'Root gap h';
    case 'linearMisalignment':
      return 'Linear misalignment e';
    case 'angularMisalignment':
      return 'Angular misalignment β';
    case 'poreDiameter':
      return 'Pore, largest size d';
    case 'endCraterDepth':
      return 'End crater depth h';
  }
}

/** A plain label without the symbol, for sentences ("cap height is needed with …"). */
export function fieldWords(name: ParameterName, seam: Seam, side?: Side): string {
  return fieldLabel(name, seam, side)
    .replace(/ [a-zαβρ][0-9]?$/u, '')
    .toLowerCase();
}

/** The plate names of this joint: plate 1 and 2 for a butt or lap joint; main plate and attachment otherwise. */
export function plateName(plate: 1 | 2, seam: Seam): string {
  if (jointFamily(seam.joint.type) === 'butt' || seam.joint.type === 'lap') return `plate ${plate}`;
  return plate === 1 ? 'main plate' : 'attachment';
}

export const sideName = (side: Side): string => (side === 'face' ? 'face side' : 'root side');

/** A toe in words, e.g. "plate 1, face side" or "attachment, root side". */
export const toeName = (toe: Toe, seam: Seam): string =>
  `${plateName(toe.plate, seam)}, ${sideName(toe.side)}`;
