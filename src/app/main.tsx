import { render } from 'preact';
import { App } from './App.js';
import { startPwa } from './pwa/start.js';
import './shell.css';

const root = document.getElementById('app');
// The Seams screen marks 'beadbook:first-screen' once its list is read and shown (npm run bench:app).
if (root) render(<App />, root);
// Service worker and update notice (own render root, above #app).
startPwa();
// Sends what waits in the outbox once the device is enrolled; wakes again on the `online` event. Loaded after the
// first render: the signing code (jose) and the sender are not needed to paint the Seams screen.
void import('./services/sync.js').then((sync) => sync.startSync());
