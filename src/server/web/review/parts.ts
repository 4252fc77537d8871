// Small pieces the review pages share: levels, verdicts and decisions in words with a shape beside the colour.
import { GRADE_CAUTION, INDICATIVE_CAUTION, levelText, type LevelMet } from '../../../domain/index.js';
import { html, type Html } from '../html.js';
import { OUTCOME_TEXT } from '../../review/decisions.js';
import type { DecisionOutcome } from '../../../protocol/index.js';

export const level = (l: string | null | undefined): string =>
  l === null || l === undefined ? '—' : levelText(l as LevelMet);

const STATE_TEXT: Record<string, string> = {
  graded: 'graded',
  incomplete: 'incomplete (checklist open)',
  noReadings: 'no readings yet',
  noSetup: 'no set-up received',
  noRounds: 'not inspected yet',
  invalid: 'cannot be graded',
};

export const stateText = (state: string): string => STATE_TEXT[state] ?? state;

/** The server's level against the required one: "✔ C (C required)" / "✘ below D (C required)". */
export function verdict(input: {
  readonly state: string;
  readonly levelMet: string | null;
  readonly meetsRequired: boolean | null;
  readonly requiredLevel: string | null;
}): Html {
  const required = input.requiredLevel ? ` (${input.requiredLevel} required)` : '';
  if (input.levelMet === null)
    return html`<span class="verdict verdict-open">◌ ${stateText(input.state)}${required}</span>`;
  if (input.meetsRequired === false)
    return html`<span class="verdict verdict-below"
      >✘ ${level(input.levelMet)}${required} — below required</span
    >`;
  if (input.meetsRequired === true)
    return html`<span class="verdict verdict-ok">✔ ${level(input.levelMet)}${required}</span>`;
  return html`<span class="verdict verdict-open"
    >◌ ${level(input.levelMet)}${required}, ${stateText(input.state)}</span
  >`;
}

export const outcomeText = (o: DecisionOutcome): string => OUTCOME_TEXT[o];

export function outcomeBadge(o: DecisionOutcome): Html {
  const mark = o === 'accepted' ? '✔' : o === 'rework' ? '↺' : '+';
  return html`<span class="badge outcome outcome-${o}">${mark} ${OUTCOME_TEXT[o]}</span>`;
}

/** UTC, to the second: the server's clock (device clocks are labelled as such where they show). */
export const utc = (iso: string | null | undefined): string =>
  iso ? iso.replace('T', ' ').replace(/(\.\d+)?Z$/, ' UTC') : '—';

export const plural = (k: number, one: string, many = `${one}s`): string => `${k} ${k === 1 ? one : many}`;

/** Both cautions, in the words every grade and every km/Kt/FAT/life figure carries. */
export function cautions(): Html {
  return html`<section class="caution" aria-label="Caution">
    <h2>Caution</h2>
    <p>${GRADE_CAUTION}</p>
    <p>${INDICATIVE_CAUTION}</p>
  </section>`;
}

export const demoBadge = (namespace: string): Html | string =>
  namespace === 'demo' ? html` <span class="badge demo">demo</span>` : '';
