// Linking rules for tags (ours): a known tag opens its seam, an unknown one is offered for a new or the current
// seam, and a tag owned by another seam never moves without a confirmation naming that owner.
import { describe, expect, it } from 'vitest';
import { ownersOf, planLink, planUnlink, scanOutcome } from '../../src/domain/index.js';

describe('scanOutcome', () => {
  it('opens the seam a linked tag belongs to', () => {
    expect(scanOutcome(ownersOf({ seamId: 'A', via: 'link' }, []), null)).toEqual({
      kind: 'open',
      seamId: 'A',
    });
    expect(scanOutcome(ownersOf({ seamId: 'A', via: 'link' }, []), 'A')).toEqual({
      kind: 'open',
      seamId: 'A',
    });
  });

  it('lets a link decide over set-ups that list the tag', () => {
    expect(scanOutcome(ownersOf({ seamId: 'A', via: 'link' }, ['B', 'C']), null)).toEqual({
      kind: 'open',
      seamId: 'A',
    });
  });

  it('opens the one seam whose set-up lists an unlinked tag', () => {
    expect(scanOutcome(ownersOf(undefined, ['B']), null)).toEqual({ kind: 'open', seamId: 'B' });
  });

  it('offers new or current seam for an unknown tag', () => {
    expect(scanOutcome([], null)).toEqual({ kind: 'unknown', currentSeamId: null });
    expect(scanOutcome([], 'C')).toEqual({ kind: 'unknown', currentSeamId: 'C' });
  });

  it('shows both seams when the tag belongs to another seam than the current one', () => {
    expect(scanOutcome(ownersOf({ seamId: 'A', via: 'link' }, []), 'B')).toEqual({
      kind: 'linkedElsewhere',
      ownerSeamId: 'A',
      currentSeamId: 'B',
    });
  });

  it('asks the user to pick when several set-ups list the tag', () => {
    expect(scanOutcome(ownersOf(undefined, ['A', 'B']), null)).toEqual({
      kind: 'ambiguous',
      seamIds: ['A', 'B'],
    });
    expect(scanOutcome(ownersOf(undefined, ['A', 'B']), 'B')).toEqual({ kind: 'open', seamId: 'B' });
  });
});

describe('planLink', () => {
  it('links a free tag with one event and does nothing for a tag already here', () => {
    expect(planLink(undefined, 'B')).toEqual({ kind: 'events', events: [{ action: 'link', seamId: 'B' }] });
    expect(planLink('B', 'B')).toEqual({ kind: 'events', events: [] });
  });

  it('never moves a tag from another seam without a confirmation for that seam', () => {
    expect(planLink('A', 'B')).toEqual({ kind: 'needsConfirmation', ownerSeamId: 'A' });
    expect(planLink('A', 'B', 'C')).toEqual({ kind: 'needsConfirmation', ownerSeamId: 'A' });
  });

  it('moves on confirmation as an unlink from the owner and a link to the target', () => {
    expect(planLink('A', 'B', 'A')).toEqual({
      kind: 'events',
      events: [
        { action: 'unlink', seamId: 'A' },
        { action: 'link', seamId: 'B' },
      ],
    });
  });

  it('unlinks only from the seam the tag is linked to', () => {
    expect(planUnlink('A', 'A')).toEqual([{ action: 'unlink', seamId: 'A' }]);
    expect(planUnlink('A', 'B')).toEqual([]);
    expect(planUnlink(undefined, 'B')).toEqual([]);
  });
});
