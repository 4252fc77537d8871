import { render } from 'preact';
import { App } from './App.js';
import { startPwa } from './pwa/start.js';
import { startSync } from './services/sync.js';
import './shell.css';

const root = document.getElementById('app');
// The Seams screen marks 'beadbook:first-screen' once its list is read and shown (npm run bench:app).
if (root) render(<App />, root);
// Service worker and update notice (own render root, above #app).
startPwa();
// Sends what waits in the outbox once the device is enrolled; wakes again on the \`online\` event.
startSync();
