// One error type for everything the store refuses, so screens can tell "fix your input" from "try again".

export type StoreErrorCode =
  /** The record asked for is not stored. */
  | 'notFound'
  /** A record with this id is stored already; append-only records are never overwritten. */
  | 'exists'
  /** The change would silently override someone else's: e.g. a tag linked to another seam (version 4). */
  | 'conflict'
  /** The input breaks a rule; the message names the field and what is allowed. */
  | 'invalid'
  /** importBackup was given something that is not a Beadbook backup. */
  | 'notBackup'
  /** close() was called on this store. */
  | 'closed'
  /** Another tab upgraded the database to a newer version: this page must reload. */
  | 'upgraded'
  /** The browser's database did not confirm the change: it counts as not saved. */
  | 'notSaved'
  /** The browser's database could not be opened or read. */
  | 'unavailable';

export class StoreError extends Error {
  override readonly name = 'StoreError';
  constructor(
    readonly code: StoreErrorCode,
    message: string,
    options?: { cause?: unknown },
  ) {
    super(message, options);
  }
}
