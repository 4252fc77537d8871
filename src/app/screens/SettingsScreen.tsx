import { useEffect, useRef, useState } from 'preact/hooks';
import type { ImportReport } from '../../store/api.js';
import { Caution } from '../components/Caution.js';
import { ExaminerSettings } from '../components/ExaminerSettings.js';
// Version, offline readiness and storage protection (with the button to ask the browser to keep the data).
import { AboutPanel } from '../pwa/AboutPanel.js';
import { InstallHint } from '../pwa/InstallHint.js';
import { hrefOf } from '../router.js';
import { getStore } from '../services/store.js';

const errorText = (e: unknown) => (e instanceof Error ? e.message : String(e));

function ExportBackup() {
  const [link, setLink] = useState<{ url: string; name: string; seams: number; readings: number } | null>(
    null,
  );
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const anchor = useRef<HTMLAnchorElement>(null);
  useEffect(() => () => (link ? URL.revokeObjectURL(link.url) : undefined), [link]);
  useEffect(() => {
    anchor.current?.click();
  }, [link]);
  const run = async () => {
    setBusy(true);
    setError(null);
    try {
      const backup = await (await getStore()).exportBackup();
      const blob = new Blob([JSON.stringify(backup, null, 1)], { type: 'application/json' });
      const stamp = backup.exportedAt.replace(/[:]/g, '-').replace(/\.\d+Z$/, 'Z');
      setLink({
        url: URL.createObjectURL(blob),
        name: `beadbook-backup-${stamp}.json`,
        seams: backup.seams.length,
        readings: backup.readings.length,
      });
    } catch (e) {
      setError(errorText(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <div class="setting">
      <button type="button" class="primary" onClick={() => void run()} disabled={busy}>
        {busy ? 'Preparing…' : 'Export backup'}
      </button>
      {link ? (
        <p role="status">
          Backup of {link.seams} seams and {link.readings} readings ready.{' '}
          <a ref={anchor} href={link.url} download={link.name}>
            Save {link.name} again
          </a>
        </p>
      ) : null}
      {error ? (
        <p role="alert" class="help help-error">
          ⚠ The backup could not be made: {error}
        </p>
      ) : null}
    </div>
  );
}

function ImportBackup() {
  const [report, setReport] = useState<ImportReport | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const pick = async (file: File | undefined) => {
    if (!file) return;
    setBusy(true);
    setError(null);
    setReport(null);
    try {
      let data: unknown;
      try {
        data = JSON.parse(await file.text());
      } catch {
        throw new Error(`${file.name} is not a Beadbook backup (it is not JSON text)`);
      }
      setReport(await (await getStore()).importBackup(data));
    } catch (e) {
      setError(errorText(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <div class="setting">
      <label class="button file-button">
        {busy ? 'Importing…' : 'Import backup'}
        <input
          type="file"
          accept=".json,application/json"
          class="visually-hidden"
          disabled={busy}
          onChange={(e) => {
            const input = e.target as HTMLInputElement;
            void pick(input.files?.[0]).finally(() => (input.value = ''));
          }}
        />
      </label>
      <p class="note">
        Adds what the file holds; records already here are skipped, never doubled, and nothing is deleted.
      </p>
      {report ? (
        <div role="status" class="report">
          <p>
            <strong>Imported:</strong> {report.seamsAdded} seams added, {report.seamsUpdated} updated,{' '}
            {report.readingsAdded} readings and {report.tagLinksAdded} tag links added;{' '}
            {report.duplicatesSkipped} already here, skipped.
          </p>
          {report.refused.length ? (
            <>
              <p>
                <strong>
                  <span aria-hidden="true">⚠ </span>
                  {report.refused.length} refused:
                </strong>
              </p>
              <ul>
                {report.refused.map((r, i) => (
                  <li key={i}>
                    {r.path}: {r.reason}
                  </li>
                ))}
              </ul>
            </>
          ) : (
            <p>Nothing refused.</p>
          )}
        </div>
      ) : null}
      {error ? (
        <p role="alert" class="help help-error">
          ⚠ {error}
        </p>
      ) : null}
    </div>
  );
}

function RemoveDemo() {
  const [asking, setAsking] = useState(false);
  const [done, setDone] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const remove = async () => {
    setBusy(true);
    setError(null);
    try {
      setDone(await (await getStore()).removeDemo());
      setAsking(false);
    } catch (e) {
      setError(errorText(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <div class="setting">
      {asking ? (
        <div class="confirm" role="group" aria-label="Confirm removing the demo data">
          <p>Remove every demo seam and its readings from this device? Your own seams are not touched.</p>
          <div class="actions">
            <button type="button" class="danger" onClick={() => void remove()} disabled={busy}>
              Yes, remove demo data
            </button>
            <button type="button" onClick={() => setAsking(false)}>
              Cancel
            </button>
          </div>
        </div>
      ) : (
        <button type="button" onClick={() => setAsking(true)}>
          Remove demo data
        </button>
      )}
      {done !== null ? <p role="status">Removed {done} demo seams.</p> : null}
      {error ? (
        <p role="alert" class="help help-error">
          ⚠ Not removed: {error}
        </p>
      ) : null}
    </div>
  );
}

export default function SettingsScreen() {
  return (
    <section class="settings" aria-labelledby="settings-title">
      <h1 id="settings-title">Settings</h1>
      <div class="panel">
        <ExaminerSettings />
      </div>
      <div class="panel">
        <h2>Sending to the yard server</h2>
        <p>
          Enrol this tablet and see what waits to be sent on the{' '}
          <a class="button" href={hrefOf({ name: 'outbox' })}>
            Outbox
          </a>{' '}
          screen.
        </p>
      </div>
      <InstallHint />
      <AboutPanel />
      <div class="panel">
        <h2>Backup</h2>
        <p>A backup file holds every seam, round and reading on this device. Keep it somewhere safe.</p>
        <ExportBackup />
        <ImportBackup />
      </div>
      <div class="panel">
        <h2>Demo data</h2>
        <RemoveDemo />
      </div>
      <Caution indicative />
    </section>
  );
}
