// Label layouts: two common self-adhesive sheets and a plain page. Sizes in millimetres, as the sheets are sold
// (common practice: 3 × 8 labels of 70 × 37 mm on A4; 3 × 10 labels of 66.7 × 25.4 mm on US Letter).

export interface SheetLayout {
  readonly id: 'a4-3x8' | 'letter-3x10' | 'plain';
  readonly name: string;
  readonly page: 'A4' | 'letter';
  readonly columns: number;
  readonly labelWidthMm: number;
  readonly labelHeightMm: number;
  /** Page margins: top and left of the first label. */
  readonly topMm: number;
  readonly leftMm: number;
  readonly perPage: number;
}

export const SHEET_LAYOUTS: readonly SheetLayout[] = [
  {
    id: 'a4-3x8',
    name: 'A4 label sheet, 3 × 8 labels of 70 × 37 mm',
    page: 'A4',
    columns: 3,
    labelWidthMm: 70,
    labelHeightMm: 37,
    topMm: 0.5,
    leftMm: 0,
    perPage: 24,
  },
  {
    id: 'letter-3x10',
    name: 'US Letter label sheet, 3 × 10 labels of 2⅝ × 1 in',
    page: 'letter',
    columns: 3,
    labelWidthMm: 66.7,
    labelHeightMm: 25.4,
    topMm: 12.7,
    leftMm: 4.8,
    perPage: 30,
  },
  {
    id: 'plain',
    name: 'Plain A4 or Letter paper, 2 × 5 large labels to cut out',
    page: 'A4',
    columns: 2,
    labelWidthMm: 90,
    labelHeightMm: 50,
    topMm: 10,
    leftMm: 10,
    perPage: 10,
  },
];

/** Labels split into pages of the layout's size. */
export function paginate<T>(labels: readonly T[], layout: SheetLayout): T[][] {
  const pages: T[][] = [];
  for (let i = 0; i < labels.length; i += layout.perPage) pages.push(labels.slice(i, i + layout.perPage));
  return pages;
}

/** A new tag for a seam that has none: "BB-" and ten characters from its id (Crockford base 32, no look-alikes). */
export function mintTag(seamId: string): string {
  const alphabet = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
  let hash = 0x811c9dc5;
  let out = '';
  // FNV-1a over the id, stretched: short and typeable, stable for the same seam.
  for (let round = 0; out.length < 10; round++) {
    for (const c of `${seamId}#${round}`) hash = Math.imul(hash ^ c.charCodeAt(0), 0x01000193) >>> 0;
    out += alphabet[hash % 32] ?? '0';
    out += alphabet[(hash >>> 5) % 32] ?? '0';
  }
  return `BB-${out.slice(0, 10)}`;
}
