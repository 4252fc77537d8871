// Review decisions: accept, send back for rework, or ask for more readings. Each is an immutable event: who, when,
// on which round, having seen which records (basedOn), signed by the server key as a flattened JWS of its own typ
// (beadbook-decision+jws) and chained to the seam's previous decision by the SHA-256 of that one's JWS, so a
// removed or reordered decision shows. The same decision goes to the devices that work on the seam through pull
// (as a server item signed for each device); the store keeps the rows unchangeable (triggers refuse UPDATE and
// DELETE), and the API has no way to change one.
import { createHash } from 'node:crypto';
import {
  canonicalJson,
  jwsBody,
  PROTOCOL_VERSION,
  randomUuid,
  signJws,
  type DecisionOutcome,
} from '../../protocol/index.js';
import type { AppDeps } from '../deps.js';
import { foldSeam } from '../grading/fold.js';
import { HttpError } from '../http/errors.js';
import type { Account, DecisionRow } from '../storage/types.js';

export const OUTCOME_TEXT: Record<DecisionOutcome, string> = {
  accepted: 'Accepted',
  rework: 'Sent back for rework',
  moreReadings: 'More readings asked for',
};

export interface DecisionInput {
  readonly seamId: string;
  readonly round: number;
  readonly outcome: DecisionOutcome;
  readonly comment?: string | undefined;
  /** The newest record the supervisor saw (the page carries it); the newest held when not given. */
  readonly basedOn?: number | undefined;
}

/** What the server signs and keeps: the decision event. */
export interface DecisionEvent {
  readonly protocol: number;
  readonly type: 'decisionEvent';
  readonly id: string;
  readonly seamId: string;
  readonly round: number;
  readonly outcome: DecisionOutcome;
  readonly comment?: string;
  readonly decidedBy: string;
  readonly decidedAt: string;
  readonly basedOn: number;
  readonly serverLevelMet: string | null;
  readonly previous: { readonly id: string; readonly jwsSha256: string } | null;
}

const sha256 = (text: string): string => createHash('sha256').update(text, 'utf8').digest('hex');

const ATTEMPTS = 3;

export async function recordDecision(deps: AppDeps, by: Account, input: DecisionInput): Promise<DecisionRow> {
  const comment = input.comment?.trim() ?? '';
  if (input.outcome !== 'accepted' && comment === '') {
    throw new HttpError(
      400,
      'invalid',
      'comment: say what the inspector must do (a comment is needed to send back or ask for more)',
    );
  }
  const material = await deps.storage.seamMaterial(input.seamId);
  if (!foldSeam(material).seam)
    throw new HttpError(404, 'unknownSeam', `no seam "${input.seamId}" is known to this server`);
  const latest = await deps.storage.latestRecordSeq(input.seamId);
  const basedOn = input.basedOn ?? latest;
  if (basedOn > latest) {
    throw new HttpError(400, 'invalid', `basedOn: the seam holds no record after #${latest}`);
  }
  const grade = await deps.storage.getServerGrade(input.seamId);
  const id = randomUuid();
  const decidedAt = deps.now().toISOString();
  const item = {
    id,
    seamId: input.seamId,
    round: input.round,
    outcome: input.outcome,
    ...(comment ? { comment } : {}),
    decidedBy: by.username,
    decidedAt,
  };
  for (let attempt = 0; attempt < ATTEMPTS; attempt++) {
    const decisions = await deps.storage.listDecisions(input.seamId);
    const previous = decisions[decisions.length - 1] ?? null;
    const event: DecisionEvent = {
      protocol: PROTOCOL_VERSION,
      type: 'decisionEvent',
      ...item,
      basedOn,
      serverLevelMet: grade?.levelMet ?? null,
      previous: previous ? { id: previous.id, jwsSha256: sha256(previous.jws) } : null,
    };
    const jws = jwsBody(
      await signJws(canonicalJson(event), 'decision', deps.serverKey.privateKey, deps.serverKey.kid),
    );
    const added = await deps.storage.addDecision({
      id,
      seamId: input.seamId,
      round: input.round,
      outcome: input.outcome,
      comment: comment || null,
      decidedBy: by.id,
      decidedByName: by.username,
      decidedAt,
      basedOn,
      serverLevelMet: event.serverLevelMet,
      jws,
      previousId: previous?.id ?? null,
      item: canonicalJson(item),
    });
    if (added.kind === 'added') {
      deps.log.info('decided', { by: by.username, seamId: input.seamId, outcome: input.outcome, id });
      return added.decision;
    }
  }
  throw new HttpError(
    409,
    'busy',
    'other decisions on this seam were being recorded at the same time; try again',
  );
}
