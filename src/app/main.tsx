import { render } from 'preact';
import './shell.css';

/** Screens planned for the app; each stays inert until its module lands. */
const SCREENS = ['Seams', 'Gauge', 'Import', 'Tag', 'Outbox', 'Settings'] as const;

function Shell() {
  return (
    <>
      <a class="skip" href="#main">
        Skip to content
      </a>
      <header class="bar">
        <h1>Beadbook</h1>
        <p>Gauge readings per seam, graded to ISO 5817 quality levels. Works offline.</p>
      </header>
      <nav aria-label="Screens">
        <ul>
          {SCREENS.map((name) => (
            <li key={name}>
              <button type="button" aria-disabled="true" aria-describedby="soon">
                {name} <span class="tag">soon</span>
              </button>
            </li>
          ))}
        </ul>
        <p id="soon" class="note">
          Coming soon: these screens are not available yet.
        </p>
      </nav>
      <main id="main" tabIndex={-1}>
        <h2>Getting started</h2>
        <p>Screens open here as they become available.</p>
      </main>
      <footer>
        <p>
          <strong>Caution:</strong> quality levels are graded against limits transcribed from ISO 5817; any
          row that rests on a recalled rather than checked value is marked <em>unverified</em>. Figures for
          km, Kt or fatigue class are indicative estimates only and do not replace an assessment to the
          governing design code by a qualified engineer. Acceptance follows the project&rsquo;s specification.
        </p>
      </footer>
    </>
  );
}

const root = document.getElementById('app');
if (root) render(<Shell />, root);
