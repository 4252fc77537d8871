// The store's public entry: open it, and the types and errors its callers handle.
export { openStore, type OpenStoreOptions } from './open-store.js';
export { StoreError, type StoreErrorCode } from './errors.js';
export { uuidv7 } from './ids.js';
export type * from './api.js';
