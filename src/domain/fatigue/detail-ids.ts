/** Ids of the fatigue details in the catalogue (IIW detail numbers, with a suffix for a variant of a row). */
export const DETAIL_IDS = [
  '211',
  '212',
  '213',
  '214',
  '215',
  '215-edge',
  '216',
  '216-noNDT',
  '217',
  '411',
  '412',
  '413',
  '414',
  '511',
  '511-ground',
  '511-thick',
  '521-50',
  '521-150',
  '521-300',
  '521-long',
] as const;

export type DetailId = (typeof DETAIL_IDS)[number];

export const isDetailId = (x: string): x is DetailId => (DETAIL_IDS as readonly string[]).includes(x);
