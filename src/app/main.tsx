import { render } from 'preact';
import { App } from './App.js';
import { startPwa } from './pwa/start.js';
import './shell.css';

const root = document.getElementById('app');
if (root) {
  render(<App />, root);
  // npm run bench:app times the offline cold start to this mark: keep it right after the first render.
  performance.mark('beadbook:first-screen');
}
// Service worker and update notice (own render root, above #app).
startPwa();
