// A round's viewing and lighting conditions: kept on the round and, for a live seam, queued for the server in the
// same transaction. Loaded on first use, outside the first paint.
import * as v from 'valibot';
import { viewingConditionsSchema, type ViewingConditions } from '../domain/model/viewing.js';
import { toProblems } from '../domain/model/schema-kit.js';
import type { RoundRecord } from './api.js';
import type { StoreContext } from './context.js';
import { StoreError } from './errors.js';
import { outboxEntry } from './records.js';
import { sameContent } from './same-content.js';
import { changeRound } from './seam-writes.js';

function checkConditions(input: ViewingConditions): ViewingConditions {
  const parsed = v.safeParse(viewingConditionsSchema, input, { abortPipeEarly: true });
  if (parsed.success) return parsed.output;
  const problems = toProblems(parsed.issues).map((p) => `${p.path}: ${p.message}`);
  throw new StoreError('invalid', `Viewing conditions not saved:\n${problems.join('\n')}`);
}

export async function recordViewing(
  ctx: StoreContext,
  seamId: string,
  roundNumber: number,
  input: ViewingConditions,
): Promise<RoundRecord> {
  const conditions = checkConditions(input);
  const now = ctx.now();
  const entry = outboxEntry(
    'viewing',
    ctx.newId(),
    { seamId, round: roundNumber, conditions, recordedAt: now },
    now,
  );
  return changeRound(ctx, seamId, roundNumber, entry, (round) =>
    sameContent(round.viewing, conditions) ? undefined : { ...round, viewing: conditions },
  );
}
