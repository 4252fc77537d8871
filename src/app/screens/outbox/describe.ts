// Words (and a shape beside them, never colour alone) for the sender's state and each waiting record.
import type { OutboxItem } from '../../../store/api.js';
import type { SenderStatus } from '../../sync/sender.js';

export interface Line {
  /** A shape that carries the meaning with the text: ✓ done, ↻ busy, ⏸ waiting, ✗ refused, ○ not set up. */
  readonly mark: string;
  readonly text: string;
}

const time = (ms: number) => new Date(ms).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' });

/** `waiting` counts every record in the outbox; `refused` those of them the server refused. */
export function describeSender(status: SenderStatus, waiting: number, refused = 0): Line {
  switch (status.state) {
    case 'sending':
      return { mark: '↻', text: 'Sending…' };
    case 'notEnrolled':
      return {
        mark: '○',
        text: 'Not enrolled: nothing is sent until this tablet is enrolled with the yard server (below). Records stay here.',
      };
    case 'keyRefused':
      return {
        mark: '✗',
        text: `The server refused this tablet's key: ${status.lastError ?? ''} Ask the supervisor for a new enrolment code.`,
      };
    case 'waiting':
      return {
        mark: '⏸',
        text: `Not sent yet: ${status.lastError ?? 'the last try failed'}. Trying again${
          status.nextAttemptAt === null ? ' soon' : ` at about ${time(status.nextAttemptAt)}`
        }; records stay here until the server confirms them.`,
      };
    case 'idle':
      if (waiting === 0)
        return { mark: '✓', text: 'Everything recorded on this tablet has reached the server.' };
      if (refused === waiting) {
        const which =
          refused === 1 ? '1 record was refused and stays' : `${refused} records were refused and stay`;
        return {
          mark: '✗',
          text: `Everything else has reached the server; ${which} on this tablet (reasons below).`,
        };
      }
      return {
        mark: '○',
        text:
          status.lastSuccessAt === null
            ? `${waiting} waiting to be sent.`
            : `${waiting} waiting; last sent at ${time(status.lastSuccessAt)}.`,
      };
  }
}

const KIND_NAMES: Record<string, string> = {
  seamSetup: 'Seam set-up',
  round: 'Round',
  checklistAnswer: 'Checklist answer',
  reading: 'Reading',
  tagLink: 'Tag link',
  viewing: 'Viewing conditions',
};

export const kindName = (kind: string): string => KIND_NAMES[kind] ?? kind;

export function describeItem(item: OutboxItem): Line {
  const send = item.send;
  if (send?.rejected) return { mark: '✗', text: `Refused by the server: ${send.rejected.reason}` };
  if (!send || send.attempts === 0) return { mark: '○', text: 'Not sent yet.' };
  const at = send.lastAttemptAt ? new Date(send.lastAttemptAt).toLocaleString() : 'unknown time';
  const tries = send.attempts === 1 ? '1 try' : `${send.attempts} tries`;
  return send.lastError
    ? { mark: '⏸', text: `${tries}; last at ${at}: ${send.lastError}` }
    : { mark: '↻', text: `${tries}; last at ${at}; waiting for the server's answer.` };
}
