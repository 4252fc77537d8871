import { jointFamily, type Seam, type Side, type Toe } from '../../../domain/index.js';

// Coordinates for the cross-section drawings (SVG user units, 320 × 170). Pure, so the toe points can be checked.

export interface Point {
  readonly x: number;
  readonly y: number;
}

export const VIEW = { width: 320, height: 170 } as const;

const clamp = (x: number, lo: number, hi: number): number => Math.min(hi, Math.max(lo, x));

/** The sides on which this joint has toes: a fillet welded from one side has none on the root side. */
export function sidesWithToes(seam: Seam): Side[] {
  return jointFamily(seam.joint.type) === 'fillet' && seam.joint.sides === 'one'
    ? ['face']
    : ['face', 'root'];
}

export interface ButtGeometry {
  readonly kind: 'butt';
  readonly plate1: string;
  readonly plate2: string;
  readonly groove: string;
  readonly cap: string;
  readonly root: string;
  readonly toes: Readonly<Record<'1face' | '2face' | '1root' | '2root', Point>>;
  readonly faceY: number;
  readonly rootY: number;
}

export interface FilletGeometry {
  readonly kind: 'fillet';
  readonly main: string;
  readonly attachment: string;
  readonly faceFillet: string;
  readonly rootFillet: string | null;
  readonly toes: Readonly<Partial<Record<'1face' | '2face' | '1root' | '2root', Point>>>;
  readonly mainTop: number;
  readonly attachmentTop: number;
}

const pts = (list: readonly (readonly [number, number])[]): string =>
  list.map(([x, y]) => `${x},${y}`).join(' ');

/** A butt joint on its mid-plane, plate thicknesses to scale (thinner plates drawn at least 16 units thick). */
export function buttGeometry(t1: number, t2: number): ButtGeometry {
  const scale = 64 / Math.max(t1, t2);
  const h1 = clamp(t1 * scale, 16, 64);
  const h2 = clamp(t2 * scale, 16, 64);
  const mid = 88;
  const top1 = mid - h1 / 2;
  const bot1 = mid + h1 / 2;
  const top2 = mid - h2 / 2;
  const bot2 = mid + h2 / 2;
  const capTop = Math.min(top1, top2) - 14;
  const rootBot = Math.max(bot1, bot2) + 10;
  return {
    kind: 'butt',
    plate1: pts([
      [8, top1],
      [136, top1],
      [152, bot1],
      [8, bot1],
    ]),
    plate2: pts([
      [184, top2],
      [312, top2],
      [312, bot2],
      [168, bot2],
    ]),
    groove: pts([
      [136, top1],
      [184, top2],
      [168, bot2],
      [152, bot1],
    ]),
    cap: `M 126 ${top1} Q 160 ${capTop} 194 ${top2} Z`,
    root: `M 144 ${bot1} Q 160 ${rootBot} 176 ${bot2} Z`,
    toes: {
      '1face': { x: 126, y: top1 },
      '2face': { x: 194, y: top2 },
      '1root': { x: 144, y: bot1 },
      '2root': { x: 176, y: bot2 },
    },
    faceY: capTop,
    rootY: rootBot,
  };
}

/** A T joint: main plate (plate 1) below, attachment (plate 2) standing on it, a fillet each side it is welded. */
export function filletGeometry(t1: number, t2: number, twoSided: boolean): FilletGeometry {
  const scale = 36 / Math.max(t1, t2);
  const h1 = clamp(t1 * scale, 12, 36);
  const w2 = clamp(t2 * scale, 12, 36);
  const mainTop = 122;
  const attachmentTop = 24;
  const leg = 30;
  const ax = 160 - w2 / 2;
  const bx = 160 + w2 / 2;
  const fillet = (x: number, dir: -1 | 1): string =>
    `M ${x} ${mainTop} L ${x + dir * leg} ${mainTop} Q ${x + dir * leg * 0.42} ${mainTop - leg * 0.42} ${x} ${mainTop - leg} Z`;
  return {
    kind: 'fillet',
    main: pts([
      [8, mainTop],
      [312, mainTop],
      [312, mainTop + h1],
      [8, mainTop + h1],
    ]),
    attachment: pts([
      [ax, attachmentTop],
      [bx, attachmentTop],
      [bx, mainTop],
      [ax, mainTop],
    ]),
    faceFillet: fillet(ax, -1),
    rootFillet: twoSided ? fillet(bx, 1) : null,
    toes: {
      '1face': { x: ax - leg, y: mainTop },
      '2face': { x: ax, y: mainTop - leg },
      ...(twoSided ? { '1root': { x: bx + leg, y: mainTop }, '2root': { x: bx, y: mainTop - leg } } : {}),
    },
    mainTop,
    attachmentTop,
  };
}

export const toeKey = (t: Toe): '1face' | '2face' | '1root' | '2root' => `${t.plate}${t.side}`;
