import type { DecisionRecord } from '../../store/api.js';
import { decisionLine, DECISION_TEXT } from './decision-text.js';
import { fmtWhen } from './format.js';

/** The seam's decisions, newest first; those the inspector had not seen yet are marked new. */
export function DecisionPanel({
  decisions,
  unseen,
}: {
  readonly decisions: readonly DecisionRecord[];
  readonly unseen: ReadonlySet<string>;
}) {
  if (!decisions.length) return null;
  const newest = [...decisions].reverse();
  return (
    <section class="panel decisions" aria-labelledby="decisions-title">
      <h2 id="decisions-title">Supervisor's decisions</h2>
      <ul class="decision-list">
        {newest.map((d) => (
          <li key={d.id} class={`decision decision-${d.outcome}`} data-decision={d.id}>
            <p class="decision-head">
              <span aria-hidden="true">{DECISION_TEXT[d.outcome].mark} </span>
              <strong>{decisionLine(d)}</strong>
              {unseen.has(d.id) ? <span class="tag tag-new">new</span> : null}
            </p>
            {d.comment ? <p class="decision-comment">“{d.comment}”</p> : null}
            <p class="note">
              {d.decidedBy}, {fmtWhen(d.decidedAt)} (server time)
              {d.roundOpened ? ` — round ${d.roundOpened} was opened on this tablet for the repair.` : ''}
            </p>
          </li>
        ))}
      </ul>
    </section>
  );
}
