// What waits in the outbox, oldest first: kind, seam, since when, and how sending went. Nothing here removes a
// record: only the server's acknowledgement does.
import type { OutboxItem } from '../../../store/api.js';
import { describeItem, kindName } from './describe.js';

/** Enough to see what is going on without making a page of thousands of rows on a tablet. */
const SHOWN = 200;

export function WaitingList(props: { readonly items: readonly OutboxItem[] }) {
  if (props.items.length === 0) return <p class="outbox-empty">Nothing waits to be sent.</p>;
  // Refused records first (they need someone's attention), then the oldest waiting.
  const refused = props.items.filter((i) => i.send?.rejected);
  const others = props.items.filter((i) => !i.send?.rejected);
  const shown = [...refused, ...others].slice(0, Math.max(SHOWN, refused.length));
  const hidden = props.items.length - shown.length;
  return (
    <>
      <ol class="outbox-list">
        {shown.map(({ entry, send }) => {
          const line = describeItem({ entry, send });
          return (
            <li key={entry.recordId} class="outbox-item" data-refused={send?.rejected ? 'yes' : 'no'}>
              <p>
                <strong>{kindName(entry.kind)}</strong> · seam {entry.seamId} · waiting since{' '}
                {new Date(entry.createdAt).toLocaleString()}
              </p>
              <p class="outbox-state">
                <span aria-hidden="true">{line.mark} </span>
                {line.text}
              </p>
              <p class="note">
                Record <code>{entry.recordId}</code>
              </p>
            </li>
          );
        })}
      </ol>
      {hidden > 0 ? <p class="note">… and {hidden} more waiting (the oldest are shown).</p> : null}
    </>
  );
}
