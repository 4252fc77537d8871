import type { Seam } from '../../domain/index.js';
import { setupRows } from './setup-rows.js';

/** The seam's set-up at a glance, as the inspector checks it against the drawing before gauging. */
export function SetupSummary({ seam }: { readonly seam: Seam }) {
  const rows = setupRows(seam);
  return (
    <dl class="facts">
      {rows.map(([k, v]) => (
        <div key={k}>
          <dt>{k}</dt>
          <dd>{v}</dd>
        </div>
      ))}
    </dl>
  );
}
