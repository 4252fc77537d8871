// Who wants to hear about a pull: screens subscribe here, and the sync client (loaded after the first render,
// with its signing code) tells them. Kept apart so a screen can listen without loading the sync client.
import type { PullOutcome } from '../sync/puller.js';

const listeners = new Set<(outcome: PullOutcome) => void>();

/** Called after every pull with what it brought (screens refresh on it); returns the unsubscribe. */
export function onPulled(listener: (outcome: PullOutcome) => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function announcePull(outcome: PullOutcome): void {
  for (const listener of listeners) listener(outcome);
}
