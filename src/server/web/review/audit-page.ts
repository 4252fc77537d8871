// The audit view of a seam: every event in the server's order, each with the signed batch it came in (which can
// be downloaded exactly as received) or its server signature, and the whole seam as one verifiable JSON file.
import { html } from '../html.js';
import { layout } from '../pages.js';
import type { AuditEvent } from '../../review/audit.js';
import type { SeamDetail } from '../../review/seam-detail.js';
import { batchesTable } from './sections.js';
import { demoBadge, utc } from './parts.js';
import { seamLinks } from './seam-page.js';

const KIND_TEXT: Record<string, string> = {
  seamSetup: 'Set-up',
  round: 'Round',
  checklistAnswer: 'Checklist answer',
  reading: 'Reading',
  assignment: 'Assignment',
  decision: 'Decision',
};

function eventRow(e: AuditEvent) {
  if (e.kind === 'record') {
    return html`<tr>
      <td>${utc(e.at)}</td>
      <td>#${e.order}</td>
      <td>${KIND_TEXT[e.recordKind] ?? e.recordKind}</td>
      <td>${e.summary}<br /><span class="kid">${e.recordId}</span></td>
      <td>
        ${e.deviceName ?? e.deviceKid ?? 'server'}${e.deviceKid ? html`<br /><span class="muted">device record no. ${e.deviceSeq}, made ${utc(e.deviceCreatedAt)} (device clock)</span>` : ''}
      </td>
      <td>
        ${
          e.batchId
            ? html`<a
                href="/supervisor/review/batches/${encodeURIComponent(e.batchId)}.jws"
                download
                class="kid"
                >${e.batchId}</a
              >`
            : '—'
        }
      </td>
    </tr>`;
  }
  return html`<tr class="event-${e.kind}">
    <td>${utc(e.at)}</td>
    <td>change ${e.order}</td>
    <td>${KIND_TEXT[e.kind]}</td>
    <td>${e.summary}<br /><span class="kid">${e.id}</span></td>
    <td>supervisor</td>
    <td>
      ${e.kind === 'decision' ? (e.verified ? '✔ server signature verified' : '✘ server signature does not verify') : 'signed for each device when pulled'}
    </td>
  </tr>`;
}

export function auditPage(user: string, d: SeamDetail, events: readonly AuditEvent[]): string {
  return layout(
    `Audit: ${d.seam?.label ?? d.id}`,
    html`<p><a href="/supervisor/review/seams/${encodeURIComponent(d.id)}">← ${d.seam?.label ?? d.id}</a></p>
      <h1>Audit trail: ${d.seam?.label ?? d.id}${demoBadge(d.namespace)}</h1>
      ${seamLinks(d.id)}
      <p>
        Every event in the order the server took it (its own receive and change numbers; device clocks are
        shown, never used to order). Records are stored exactly as the signed batch carried them.
      </p>
      <table class="audit">
        <thead>
          <tr>
            <th scope="col">Server time</th>
            <th scope="col">Order</th>
            <th scope="col">Event</th>
            <th scope="col">What</th>
            <th scope="col">By</th>
            <th scope="col">Signed batch / signature</th>
          </tr>
        </thead>
        <tbody>
          ${events.map(eventRow)}
        </tbody>
      </table>
      <h2>Batches</h2>
      ${batchesTable(d.batches)}`,
    user,
    { bodyClass: 'wide' },
  );
}
