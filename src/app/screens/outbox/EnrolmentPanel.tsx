// Enrolment: the code from the supervisor's Devices page, typed or pasted. Camera scanning comes later.
import { useEffect, useState } from 'preact/hooks';
import { TextField } from '../../components/TextField.js';
import type { SyncClient } from '../../services/sync.js';
import { enrolDevice } from '../../sync/enrol-device.js';
import type { Enrolment } from '../../sync/device-vault.js';
import { fetchTransport } from '../../sync/transport.js';

export function EnrolmentPanel(props: { readonly sync: SyncClient }) {
  const { vault, sender } = props.sync;
  const [enrolment, setEnrolment] = useState<Enrolment | null | undefined>(undefined);
  const [code, setCode] = useState('');
  const [label, setLabel] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [changing, setChanging] = useState(false);
  useEffect(() => {
    vault.enrolment().then(setEnrolment, (e: unknown) => {
      setEnrolment(null);
      setError(`The device key could not be read: ${e instanceof Error ? e.message : String(e)}`);
    });
  }, [vault]);

  const enrol = async () => {
    setBusy(true);
    setError(null);
    const origin = location.origin;
    const outcome = await enrolDevice(
      { code, ...(label.trim() ? { label } : {}) },
      { vault, transport: fetchTransport(origin), serverOrigin: origin },
    );
    setBusy(false);
    if (!outcome.ok) {
      setError(outcome.message);
      return;
    }
    setEnrolment(outcome.enrolment);
    setChanging(false);
    setCode('');
    void sender.sendNow();
  };

  if (enrolment === undefined) return <p>Reading this tablet's enrolment…</p>;
  return (
    <section class="panel enrolment" aria-labelledby="enrolment-title">
      <h2 id="enrolment-title">Enrolment</h2>
      {enrolment ? (
        <dl class="facts" data-enrolled="yes">
          <dt>State</dt>
          <dd>✓ Enrolled</dd>
          <dt>Server</dt>
          <dd>{enrolment.serverOrigin}</dd>
          <dt>Name on the server</dt>
          <dd>{enrolment.name}</dd>
          <dt>Since</dt>
          <dd>{new Date(enrolment.enrolledAt).toLocaleString()}</dd>
          <dt>Device key</dt>
          <dd>
            <code>{enrolment.deviceKid.slice(0, 12)}…</code>
          </dd>
        </dl>
      ) : (
        <p data-enrolled="no">
          ○ Not enrolled. Ask the supervisor to show an enrolment code on the Devices page, and type it here.
          If this tablet was enrolled before and its storage was cleared, it enrols again as a new device.
        </p>
      )}
      {!enrolment || changing ? (
        <form
          class="enrol-form"
          onSubmit={(e) => {
            e.preventDefault();
            void enrol();
          }}
        >
          <TextField
            label="Enrolment code"
            value={code}
            onChange={setCode}
            required
            hint="8 letters and digits, like 7KQ2-M9XD, or the whole text under the QR code."
            error={error ?? undefined}
            autoComplete="off"
          />
          <TextField
            label="Name for this tablet"
            value={label}
            onChange={setLabel}
            hint="Shown to the supervisor; they can change it."
          />
          <div class="actions">
            <button type="submit" class="primary" disabled={busy || code.trim() === ''}>
              {busy ? 'Enrolling…' : 'Enrol this tablet'}
            </button>
            {changing ? (
              <button type="button" onClick={() => setChanging(false)}>
                Cancel
              </button>
            ) : null}
          </div>
        </form>
      ) : (
        <button type="button" onClick={() => setChanging(true)}>
          Enrol again with a new code
        </button>
      )}
    </section>
  );
}
