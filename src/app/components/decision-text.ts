import type { DecisionRecord } from '../../store/api.js';

// A supervisor's decision in the inspector's words; the shape repeats the meaning, so it never rests on colour.
export const DECISION_TEXT: Record<DecisionRecord['outcome'], { mark: string; text: string }> = {
  accepted: { mark: '✔', text: 'Accepted by the supervisor' },
  rework: { mark: '↺', text: 'Sent back for rework' },
  moreReadings: { mark: '+', text: 'More readings asked for' },
};

export function decisionLine(d: DecisionRecord): string {
  return `${DECISION_TEXT[d.outcome].text} (round ${d.round})`;
}
