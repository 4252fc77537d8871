/** The visual items no gauge measures, answered once per round. ISO 6520-1 reference numbers. */
export const CHECKLIST_ITEMS = [
  'crack',
  'craterCrack',
  'lackOfFusion',
  'burnThrough',
  'porosity',
  'rootPorosity',
  'poorRestart',
  'strayArc',
  'spatter',
  'temperColour',
] as const;

export type ChecklistItem = (typeof CHECKLIST_ITEMS)[number];

export const CHECKLIST_ANSWERS = ['noneFound', 'present', 'notAccessible'] as const;
export type ChecklistAnswerKind = (typeof CHECKLIST_ANSWERS)[number];

export const CHECKLIST_LABEL: Record<ChecklistItem, string> = {
  crack: 'Cracks',
  craterCrack: 'Crater cracks',
  lackOfFusion: 'Lack of fusion (visible)',
  burnThrough: 'Burn-through',
  porosity: 'Surface pores or porosity',
  rootPorosity: 'Root porosity',
  poorRestart: 'Poor restart',
  strayArc: 'Stray arc strikes',
  spatter: 'Spatter',
  temperColour: 'Temper colour',
};
