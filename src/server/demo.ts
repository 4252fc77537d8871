// The demo yard on the server: loaded only when asked for (npm start -- --demo, or BEADBOOK_DEMO=1), kept in the
// demo namespace and marked as demo wherever it shows. Its rounds, answers and readings are stored as records
// the server made itself (no device, no batch), then graded like any seam.
import { canonicalJson, recordSchemaVersionOf } from '../protocol/index.js';
import { kestrelPointYard } from '../demo/kestrel-point-yard.js';
import type { AppDeps } from './deps.js';
import type { StoredRecord } from './storage/types.js';

const DEMO_TIME = '2026-11-18T07:00:00Z';

type ServerRecord = Omit<StoredRecord, 'receiveSeq' | 'deviceKid' | 'batchId'>;

export async function loadDemoYard(deps: AppDeps): Promise<{ seams: number; records: number }> {
  const receivedAt = deps.now().toISOString();
  let seams = 0;
  let records = 0;
  for (const file of kestrelPointYard()) {
    const seamId = file.seam.id;
    const existing = await deps.storage.getSeam(seamId);
    if (existing) continue;
    await deps.storage.putSeam(
      { id: seamId, namespace: 'demo', setup: canonicalJson(file.seam), createdAt: receivedAt },
      null,
    );
    const out: ServerRecord[] = [];
    const add = (id: string, kind: string, body: unknown, at: string) =>
      out.push({
        id,
        kind,
        schemaVersion: recordSchemaVersionOf(kind),
        seamId,
        deviceSeq: out.length + 1,
        body: canonicalJson(body),
        deviceCreatedAt: at,
        receivedAt,
      });
    for (const round of file.rounds) {
      const startedAt = round.startedAt ?? DEMO_TIME;
      add(
        `${seamId}/round/${round.number}`,
        'round',
        {
          seamId,
          number: round.number,
          kind: round.kind,
          startedAt,
          ...(round.examiner ? { examiner: round.examiner } : {}),
        },
        startedAt,
      );
      for (const [item, answer] of Object.entries(round.checklist)) {
        if (!answer) continue;
        add(
          `${seamId}/round/${round.number}/${item}`,
          'checklistAnswer',
          {
            seamId,
            round: round.number,
            item,
            answer,
            answeredAt: startedAt,
          },
          startedAt,
        );
      }
    }
    for (const reading of file.readings) add(reading.id, 'reading', { seamId, reading }, reading.recordedAt);
    records += await deps.storage.insertServerRecords(out);
    seams += 1;
    deps.regrader.schedule([seamId]);
  }
  await deps.regrader.idle();
  await deps.reviewIndexer.idle();
  deps.log.info('demoLoaded', { seams, records });
  return { seams, records };
}
