import { openStore } from '../../store/index.js';
import type { Store } from '../../store/api.js';

let store: Promise<Store> | null = null;

/** The one store connection of the page, opened on first use. */
export function getStore(): Promise<Store> {
  store ??= openStore({
    onBlocking: () => {
      // Another tab needs a newer database: this page's data model is outdated, so it reloads.
      location.reload();
    },
  });
  return store;
}
