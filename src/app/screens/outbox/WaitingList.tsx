// What waits in the outbox, oldest first: kind, seam, since when, and how sending went. Nothing here removes a
// record: only the server's acknowledgement does.
import type { OutboxItem } from '../../../store/api.js';
import { describeItem, kindName } from './describe.js';

export function WaitingList(props: { readonly items: readonly OutboxItem[] }) {
  if (props.items.length === 0) return <p class="outbox-empty">Nothing waits to be sent.</p>;
  return (
    <ol class="outbox-list">
      {props.items.map(({ entry, send }) => {
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
  );
}
