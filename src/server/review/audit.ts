// A seam's audit trail: every event the server holds for it, in the order the server took them (its receive and
// change sequence, never a device clock), each with what proves it: the signed batch a record came in, the server
// signature of a decision. And the export a third party can check offline with any JWS library (docs/review.md):
// the seam with its batches exactly as received, the enrolled device keys, the decisions and the server key.
import { parseFlattenedJws, PROTOCOL_VERSION } from '../../protocol/index.js';
import type { AppDeps } from '../deps.js';
import type { SeamDetail } from './seam-detail.js';

export type AuditEvent =
  | {
      readonly kind: 'record';
      readonly at: string;
      readonly order: number;
      readonly recordId: string;
      readonly recordKind: string;
      readonly deviceKid: string | null;
      readonly deviceName: string | null;
      readonly batchId: string | null;
      readonly deviceSeq: number;
      /** The device clock when it queued the record (shown, never used for order). */
      readonly deviceCreatedAt: string;
      readonly summary: string;
    }
  | {
      readonly kind: 'assignment' | 'decision';
      readonly at: string;
      readonly order: number;
      readonly id: string;
      readonly deviceKid: string | null;
      readonly summary: string;
      readonly verified?: boolean;
    };

function recordSummary(kind: string, body: Record<string, unknown>): string {
  switch (kind) {
    case 'seamSetup':
      return `set-up revision ${String(body['revision'])}`;
    case 'round':
      return `round ${String(body['number'])} started (${String(body['kind'])})`;
    case 'checklistAnswer': {
      const answer = body['answer'] as { answer?: string } | undefined;
      return `round ${String(body['round'])} checklist: ${String(body['item'])} — ${answer?.answer ?? '?'}`;
    }
    case 'reading': {
      const r = body['reading'] as { id: string; round: number; supersedes?: string; withdrawn?: boolean };
      if (r.withdrawn) return `round ${r.round} withdrawal of reading ${r.supersedes ?? '?'}`;
      return `round ${r.round} reading ${r.id}${r.supersedes ? ` (corrects ${r.supersedes})` : ''}`;
    }
    default:
      return kind;
  }
}

/** Records by receive order, then changes; both sequences are the server's own. */
export function auditEvents(d: SeamDetail): AuditEvent[] {
  const events: AuditEvent[] = d.records.map((r) => ({
    kind: 'record',
    at: r.receivedAt,
    order: r.receiveSeq,
    recordId: r.id,
    recordKind: r.kind,
    deviceKid: r.deviceKid,
    deviceName: r.deviceKid ? (d.devices.get(r.deviceKid)?.name ?? null) : null,
    batchId: r.batchId,
    deviceSeq: r.deviceSeq,
    deviceCreatedAt: r.deviceCreatedAt,
    summary: recordSummary(r.kind, JSON.parse(r.body) as Record<string, unknown>),
  }));
  const decisions = new Map(d.decisions.map((x) => [x.id, x]));
  for (const c of d.changes) {
    const decision = decisions.get(c.itemId);
    const item = JSON.parse(c.item) as {
      outcome?: string;
      comment?: string;
      note?: string;
      decidedBy?: string;
      assignedBy?: string;
    };
    events.push({
      kind: c.kind,
      at: c.createdAt,
      order: c.seq,
      id: c.itemId,
      deviceKid: c.deviceKid,
      summary:
        c.kind === 'decision'
          ? `${item.outcome ?? '?'} by ${item.decidedBy ?? '?'}${item.comment ? `: ${item.comment}` : ''}`
          : `assigned to ${c.deviceKid ? (d.devices.get(c.deviceKid)?.name ?? c.deviceKid) : '?'} by ${item.assignedBy ?? '?'}${item.note ? `: ${item.note}` : ''}`,
      ...(decision ? { verified: decision.verified } : {}),
    });
  }
  // Server time first; records before changes at the same instant; each sequence keeps its own order.
  return events.sort(
    (a, b) =>
      a.at.localeCompare(b.at) ||
      (a.kind === 'record' ? 0 : 1) - (b.kind === 'record' ? 0 : 1) ||
      a.order - b.order,
  );
}

function jwsObject(text: string): unknown {
  try {
    return parseFlattenedJws(JSON.parse(text));
  } catch {
    return null;
  }
}

/** The seam with everything needed to check its signatures offline. */
export function seamBundle(deps: AppDeps, d: SeamDetail, now: string) {
  const deviceKids = new Set(d.batches.map((b) => b.deviceKid));
  return {
    format: 'beadbook.seam-audit/1',
    protocol: PROTOCOL_VERSION,
    exportedAt: now,
    howToVerify:
      'Each batches[].jws is a flattened JWS (RFC 7515, ES256) exactly as the device sent it; verify it with the ' +
      'public key in devices[] whose kid equals the JWS protected header kid. Each decisions[].jws is signed by ' +
      'serverKey. See docs/review.md.',
    seamId: d.id,
    namespace: d.namespace,
    seam: d.seam,
    serverGrade: d.review.summary,
    serverKey: { kid: deps.serverKey.kid, jwk: deps.serverKey.publicJwk },
    devices: [...deviceKids].map((kid) => {
      const device = d.devices.get(kid);
      return {
        kid,
        name: device?.name ?? null,
        enrolledAt: device?.enrolledAt ?? null,
        revokedAt: device?.revokedAt ?? null,
        jwk: device ? (JSON.parse(device.publicJwk) as unknown) : null,
      };
    }),
    batches: d.batches.map((b) => ({
      batchId: b.batchId,
      deviceKid: b.deviceKid,
      deviceSeq: b.deviceSeq,
      receivedAt: b.receivedAt,
      verifiedOnExport: b.verified,
      /** The flattened JWS as a JSON object, and the request body exactly as received. */
      jws: jwsObject(b.jws),
      received: b.jws,
    })),
    decisions: d.decisions.map((x) => ({
      id: x.id,
      round: x.round,
      outcome: x.outcome,
      comment: x.comment,
      decidedBy: x.decidedByName,
      decidedAt: x.decidedAt,
      jws: jwsObject(x.jws),
    })),
    assignments: d.assignments,
  };
}
