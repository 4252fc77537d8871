import type { Confidence, LimitStatus } from '../criteria/types.js';
import { limitStatus } from '../criteria/types.js';
import {
  CHECKLIST_ITEMS,
  CHECKLIST_LABEL,
  type ChecklistAnswerKind,
  type ChecklistItem,
} from '../model/checklist.js';
import { LEVELS, meets, type Level, type LevelMet } from '../model/levels.js';
import type { Checklist } from '../model/seam-file.js';
import type { RequiredLevels } from './required.js';

/** Whether "present" is permitted at a level; 'dependsOnApplication' leaves the level unchanged, with a note. */
type Permission = 'notPermitted' | 'permitted' | 'permittedWhenThick' | 'dependsOnApplication';

interface ChecklistRule {
  readonly ref: string;
  readonly row: string;
  readonly levels: Readonly<Record<Level, Permission>>;
  readonly confidence: Confidence;
  readonly note?: string;
}

const NP_ALL = { B: 'notPermitted', C: 'notPermitted', D: 'notPermitted' } as const;
const D_ONLY = { B: 'notPermitted', C: 'notPermitted', D: 'permitted' } as const;
const APP = { B: 'dependsOnApplication', C: 'dependsOnApplication', D: 'dependsOnApplication' } as const;

// ISO 5817:2014 Table 1 rows for imperfections judged by eye (limits reference §2; confidence as given there).
export const CHECKLIST_RULES: Readonly<Record<ChecklistItem, ChecklistRule>> = {
  crack: { ref: '100', row: '1.1', levels: NP_ALL, confidence: 'P' },
  craterCrack: { ref: '104', row: '1.2', levels: NP_ALL, confidence: 'P' },
  lackOfFusion: { ref: '401', row: '1.5', levels: NP_ALL, confidence: 'P' },
  burnThrough: { ref: '510', row: '1.15', levels: NP_ALL, confidence: 'M-hi' },
  porosity: {
    ref: '2017',
    row: '1.3',
    levels: { B: 'notPermitted', C: 'permittedWhenThick', D: 'permitted' },
    confidence: 'P',
    note: 'measure the largest pore: its diameter is graded against row 1.3',
  },
  rootPorosity: {
    ref: '516',
    row: '1.18',
    levels: D_ONLY,
    confidence: 'M-med',
    note: 'level D permits it locally',
  },
  poorRestart: {
    ref: '517',
    row: '1.19',
    levels: D_ONLY,
    confidence: 'M-med',
    note: 'at level D the limit depends on the imperfection that occurs',
  },
  strayArc: {
    ref: '601',
    row: '1.22',
    levels: D_ONLY,
    confidence: 'M-hi',
    note: 'level D permits it only where the parent metal is not affected',
  },
  spatter: {
    ref: '602',
    row: '1.23',
    levels: APP,
    confidence: 'S',
    note: 'acceptance depends on the application',
  },
  temperColour: {
    ref: '610',
    row: '1.24',
    levels: APP,
    confidence: 'M-med',
    note: 'acceptance depends on the application',
  },
};

export interface ChecklistItemGrade {
  readonly item: ChecklistItem;
  readonly label: string;
  readonly ref: string;
  readonly row: string;
  readonly answer: ChecklistAnswerKind | 'unanswered';
  readonly position?: number;
  /** null when unanswered or not accessible: nothing was assessed. */
  readonly levelMet: LevelMet | null;
  readonly required: Level;
  readonly meetsRequired: boolean | null;
  readonly status: LimitStatus;
  readonly notes: readonly string[];
}

export interface ChecklistGrade {
  readonly state: 'complete' | 'incomplete';
  readonly unanswered: readonly ChecklistItem[];
  readonly notAccessible: readonly ChecklistItem[];
  readonly items: readonly ChecklistItemGrade[];
}

function levelWhenPresent(rule: ChecklistRule, tMin: number): { level: LevelMet; notes: string[] } {
  const notes: string[] = [];
  let level: LevelMet = 'belowD';
  for (let i = LEVELS.length - 1; i >= 0; i--) {
    const lv = LEVELS[i] as Level;
    const p = rule.levels[lv];
    const ok = p === 'permitted' || p === 'dependsOnApplication' || (p === 'permittedWhenThick' && tMin > 3);
    if (!ok) break;
    level = lv;
  }
  if (rule.note) notes.push(rule.note);
  return { level, notes };
}

export function gradeChecklist(checklist: Checklist, tMin: number, required: RequiredLevels): ChecklistGrade {
  const items: ChecklistItemGrade[] = [];
  const unanswered: ChecklistItem[] = [];
  const notAccessible: ChecklistItem[] = [];
  for (const item of CHECKLIST_ITEMS) {
    const rule = CHECKLIST_RULES[item];
    const answer = checklist[item];
    const req = required.forRefs([rule.ref]);
    const base = {
      item,
      label: CHECKLIST_LABEL[item],
      ref: rule.ref,
      row: rule.row,
      required: req,
      status: limitStatus(rule.confidence),
    };
    if (!answer) {
      unanswered.push(item);
      items.push({
        ...base,
        answer: 'unanswered',
        levelMet: null,
        meetsRequired: null,
        notes: ['not answered yet'],
      });
      continue;
    }
    const position = answer.position === undefined ? {} : { position: answer.position };
    if (answer.answer === 'notAccessible') {
      notAccessible.push(item);
      items.push({
        ...base,
        ...position,
        answer: 'notAccessible',
        levelMet: null,
        meetsRequired: null,
        notes: ['not accessible: not assessed'],
      });
      continue;
    }
    const { level, notes } =
      answer.answer === 'present' ? levelWhenPresent(rule, tMin) : { level: 'B' as const, notes: [] };
    items.push({
      ...base,
      ...position,
      answer: answer.answer,
      levelMet: level,
      meetsRequired: meets(level, req),
      notes,
    });
  }
  return { state: unanswered.length ? 'incomplete' : 'complete', unanswered, notAccessible, items };
}
