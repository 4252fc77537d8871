// The supervisor's pages: the shared layout, sign-in, password and Devices (enrolment code, rename, revoke, last
// contact, queue). The review and Seams pages are in review/ and seams-page.ts. Plain HTML forms; no inline script.
import type { Account, Device } from '../storage/types.js';
import { html, type Html } from './html.js';
import { qrSvg } from './qr.js';
import type { IssuedCode } from '../admin/service.js';

export function layout(
  title: string,
  body: Html,
  signedIn: string | null,
  options: { readonly bodyClass?: string; readonly script?: string } = {},
): string {
  return `<!doctype html>${
    html`<html lang="en">
      <head>
        <meta charset="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <title>${title} · Beadbook supervisor</title>
        <link rel="stylesheet" href="/supervisor/style.css" />
        ${options.script ? html`<script type="module" src="${options.script}"></script>` : ''}
      </head>
      <body class="${options.bodyClass ?? ''}">
        <header class="site">
          <strong>Beadbook supervisor</strong>
          ${
            signedIn === null
              ? ''
              : html`<a href="/supervisor/review">Review</a> <a href="/supervisor/seams">Seams</a>
                  <a href="/supervisor/devices">Devices</a>
                  <form method="post" action="/supervisor/logout">
                    <span>${signedIn}</span> <button type="submit">Sign out</button>
                  </form>`
          }
        </header>
        <main>${body}</main>
      </body>
    </html>`.text
  }`;
}

export function loginPage(error: string | null): string {
  return layout(
    'Sign in',
    html`<h1>Sign in</h1>
      ${error ? html`<p class="error" role="alert">${error}</p>` : ''}
      <form method="post" action="/supervisor/login">
        <label
          >Name <input type="text" name="username" autocomplete="username" required maxlength="80"
        /></label>
        <label
          >Password
          <input type="password" name="password" autocomplete="current-password" required maxlength="1024"
        /></label>
        <button type="submit">Sign in</button>
      </form>`,
    null,
  );
}

export function passwordPage(user: string, mustChange: boolean, error: string | null): string {
  return layout(
    'Password',
    html`<h1>Set a new password</h1>
      ${mustChange ? html`<p>This account has a one-time password. Choose your own before going on.</p>` : ''}
      ${error ? html`<p class="error" role="alert">${error}</p>` : ''}
      <form method="post" action="/supervisor/password">
        <label
          >Current password <input type="password" name="current" autocomplete="current-password" required
        /></label>
        <label
          >New password (at least 10 characters)
          <input type="password" name="next" autocomplete="new-password" required minlength="10"
        /></label>
        <button type="submit">Save</button>
      </form>`,
    user,
  );
}

export const when = (iso: string | null): string =>
  iso === null ? 'never' : iso.replace('T', ' ').replace(/\.\d+Z$/, ' UTC');

/** A choice of inspector account; "" stands for none. */
export const inspectorSelect = (
  inspectors: readonly Account[],
  name: string,
  selected: string | null,
  none: string,
  label?: string,
): Html =>
  html`<select name="${name}" ${label ? html`aria-label="${label}"` : ''}>
    <option value="">${none}</option>
    ${inspectors.map(
      (i) =>
        html`<option value="${i.username}" ${selected === i.username ? html`selected` : ''}>
          ${i.username}
        </option>`,
    )}
  </select>`;

function deviceRow(d: Device, inspectors: readonly Account[]): Html {
  const revoked = d.revokedAt !== null;
  return html`<tr>
    <td>
      ${d.name} ${revoked ? html`<span class="badge revoked">revoked ${when(d.revokedAt)}</span>` : ''}<br /><span
        class="kid"
        >${d.kid}</span
      >
    </td>
    <td>
      ${
        revoked
          ? (d.inspectorName ?? '—')
          : html`<form method="post" action="/supervisor/devices/${encodeURIComponent(d.kid)}/inspector">
              ${inspectorSelect(inspectors, 'inspector', d.inspectorName, 'no inspector', `Inspector of ${d.name}`)}
              <button type="submit">Set</button>
            </form>`
      }
    </td>
    <td>${when(d.enrolledAt)}</td>
    <td>${when(d.lastContactAt)}</td>
    <td>
      ${d.reportedQueue === null ? 'not reported' : html`${d.reportedQueue} waiting${d.reportedOldestAt ? html`<br />oldest made ${when(d.reportedOldestAt)} (device clock)` : ''}<br />reported ${when(d.reportedAt)}`}
    </td>
    <td>
      <form method="post" action="/supervisor/devices/${encodeURIComponent(d.kid)}/name">
        <input
          type="text"
          name="name"
          value="${d.name}"
          maxlength="80"
          aria-label="Name of ${d.name}"
          required
        />
        <button type="submit">Rename</button>
      </form>
      ${
        revoked
          ? ''
          : html`<form method="post" action="/supervisor/devices/${encodeURIComponent(d.kid)}/revoke">
              <label
                ><input type="checkbox" name="confirm" value="yes" required /> I want to revoke this
                device</label
              >
              <button type="submit">Revoke</button>
            </form>`
      }
    </td>
  </tr>`;
}

export function devicesPage(
  user: string,
  devices: readonly Device[],
  code: IssuedCode | null,
  notice: string | null,
  inspectors: readonly Account[] = [],
): string {
  return layout(
    'Devices',
    html`<h1>Devices</h1>
      ${notice ? html`<p class="notice" role="status">${notice}</p>` : ''}
      <section class="panel">
        <h2>Enrol a tablet</h2>
        ${
          code
            ? html`<p>
                  On the tablet, open Beadbook and scan this code, or type it in. It works once and expires at
                  ${when(code.expiresAt)}.
                </p>
                <p class="code">${code.code}</p>
                ${qrSvg(code.ticket)}
                <p>Server key: <span class="kid">${code.serverKid}</span></p>
                <p>
                  ${code.inspector ? html`The tablet will work for inspector <strong>${code.inspector}</strong>.` : 'The tablet will work for no inspector in particular.'}
                </p>`
            : html`<p>
                Show a one-time enrolment code for a new tablet (or for one whose storage was wiped: it enrols
                as a new device).
              </p>`
        }
        <form method="post" action="/supervisor/devices/code">
          <label
            >For inspector
            ${inspectorSelect(inspectors, 'inspector', code?.inspector ?? null, 'nobody in particular')}</label
          >
          <button type="submit">${code ? 'New code' : 'Show an enrolment code'}</button>
        </form>
      </section>
      <section class="panel" aria-labelledby="inspectors-title">
        <h2 id="inspectors-title">Inspectors</h2>
        <p>
          Seams can be assigned to an inspector instead of one tablet: every tablet that works for the
          inspector (chosen below, or when its enrolment code is shown) receives them on its next sync.
        </p>
        <p>
          ${inspectors.length ? inspectors.map((i) => i.username).join(', ') : 'No inspector account yet.'}
        </p>
        <form method="post" action="/supervisor/inspectors">
          <label
            >Name <input type="text" name="username" required maxlength="40" pattern="[A-Za-z0-9._-]{1,40}"
          /></label>
          <label
            >Password (at least 10 characters)
            <input type="password" name="password" required minlength="10" autocomplete="new-password"
          /></label>
          <button type="submit">Add the inspector</button>
        </form>
      </section>
      <table>
        <thead>
          <tr>
            <th>Device</th>
            <th>Inspector</th>
            <th>Enrolled</th>
            <th>Last contact</th>
            <th>Outbox</th>
            <th>Actions</th>
          </tr>
        </thead>
        <tbody>
          ${
            devices.length
              ? devices.map((d) => deviceRow(d, inspectors))
              : html`<tr>
                  <td colspan="6">No device is enrolled yet.</td>
                </tr>`
          }
        </tbody>
      </table>`,
    user,
  );
}

export function errorPage(status: number, message: string): string {
  return layout(
    `Error ${status}`,
    html`<h1>${status === 404 ? 'Not found' : 'Something went wrong'}</h1>
      <p>${message}</p>`,
    null,
  );
}
