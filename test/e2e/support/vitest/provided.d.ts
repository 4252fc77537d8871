// What the browser tests' global setup hands to the test files (read with inject('e2eBuilds')).
import 'vitest';

declare module 'vitest' {
  export interface ProvidedContext {
    e2eBuilds: {
      /** The app as it is now. */
      readonly current: { readonly dir: string; readonly version: string };
      /** The same source with another version stamp: a second deploy. */
      readonly next: { readonly dir: string; readonly version: string };
      /** test/e2e/fixtures/components built on its own (no service worker). */
      readonly components: { readonly dir: string };
    };
  }
}
