import type { Connection } from './connection.js';

/** What every store operation needs: the connection, and the clock and id source (replaceable in tests). */
export interface StoreContext {
  readonly conn: Connection;
  readonly now: () => string;
  readonly newId: () => string;
}
