/** The app version, stamped by vite.config.ts (package.json, or BEADBOOK_VERSION at build time). */
declare const __BEADBOOK_VERSION__: string;
