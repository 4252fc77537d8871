// What scanning a tag leads to, and what linking it changes. A tag belongs to at most one seam. A known tag opens
// its seam; an unknown one may start a new seam or join the current one; a tag that belongs to another seam is
// never moved without the user having seen both seams and confirmed the move.

export interface TagOwner {
  readonly seamId: string;
  /** 'link': linked by scanning or typing on this device (or synced); 'setup': listed in the seam's set-up. */
  readonly via: 'link' | 'setup';
}

export type ScanOutcome =
  /** The tag belongs to this seam: open it. */
  | { readonly kind: 'open'; readonly seamId: string }
  /** Nobody owns the tag: offer a new seam with it, or (when there is one) adding it to the current seam. */
  | { readonly kind: 'unknown'; readonly currentSeamId: string | null }
  /** The user came from one seam and the tag belongs to another: show both, open the owner or move on confirm. */
  | { readonly kind: 'linkedElsewhere'; readonly ownerSeamId: string; readonly currentSeamId: string }
  /** Several set-ups list the tag and no link decides: the user picks. */
  | { readonly kind: 'ambiguous'; readonly seamIds: readonly string[] };

/**
 * Owners of a tag: a link decides alone; without one, every seam whose set-up lists the tag. `setupSeamIds`
 * should hold each seam once.
 */
export function ownersOf(link: TagOwner | undefined, setupSeamIds: readonly string[]): TagOwner[] {
  if (link) return [link];
  return setupSeamIds.map((seamId) => ({ seamId, via: 'setup' }));
}

/** What a scan leads to, from the tag's owners and the seam the user came from (if any). */
export function scanOutcome(owners: readonly TagOwner[], currentSeamId: string | null): ScanOutcome {
  const [only, ...more] = owners;
  if (!only) return { kind: 'unknown', currentSeamId };
  if (more.length) {
    const ids = owners.map((o) => o.seamId);
    if (currentSeamId !== null && ids.includes(currentSeamId)) return { kind: 'open', seamId: currentSeamId };
    return { kind: 'ambiguous', seamIds: ids };
  }
  if (currentSeamId === null || only.seamId === currentSeamId) return { kind: 'open', seamId: only.seamId };
  return { kind: 'linkedElsewhere', ownerSeamId: only.seamId, currentSeamId };
}

export type LinkEvent = { readonly action: 'link' | 'unlink'; readonly seamId: string };

export type LinkPlan =
  | { readonly kind: 'events'; readonly events: readonly LinkEvent[] }
  /** The tag belongs to another seam and the move was not confirmed for that seam: nothing changes. */
  | { readonly kind: 'needsConfirmation'; readonly ownerSeamId: string };

/**
 * The events that link a tag to `targetSeamId`. A move needs `confirmedFrom` naming the present owner: a
 * confirmation given for another owner (the tag moved meanwhile, e.g. by a sync) does not count.
 */
export function planLink(
  linkedTo: string | undefined,
  targetSeamId: string,
  confirmedFrom?: string,
): LinkPlan {
  if (linkedTo === targetSeamId) return { kind: 'events', events: [] };
  if (linkedTo === undefined) return { kind: 'events', events: [{ action: 'link', seamId: targetSeamId }] };
  if (confirmedFrom !== linkedTo) return { kind: 'needsConfirmation', ownerSeamId: linkedTo };
  return {
    kind: 'events',
    events: [
      { action: 'unlink', seamId: linkedTo },
      { action: 'link', seamId: targetSeamId },
    ],
  };
}

/** The events that unlink a tag from `seamId`: none when it is not linked there. */
export function planUnlink(linkedTo: string | undefined, seamId: string): readonly LinkEvent[] {
  return linkedTo === seamId ? [{ action: 'unlink', seamId }] : [];
}
