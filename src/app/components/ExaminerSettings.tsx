import { useState } from 'preact/hooks';
import {
  checkExaminer,
  readExaminer,
  saveExaminer,
  type Examiner,
  type ExaminerDraft,
} from '../screens/gauge/examiner.js';
import { TextField } from './TextField.js';

/**
 * Who inspects on this device: the name (and qualification) put on every reading and every new round. Kept in
 * this browser's local storage, not synced as a setting.
 */
export function ExaminerSettings() {
  const [saved, setSaved] = useState<Examiner | undefined>(() => readExaminer(localStorage));
  const [draft, setDraft] = useState<ExaminerDraft>(() => ({
    name: saved?.name ?? '',
    qualification: saved?.qualification ?? '',
  }));
  const [tried, setTried] = useState(false);
  const [status, setStatus] = useState('');
  const problems = checkExaminer(draft);
  const shown = tried ? problems : {};
  const save = (e: Event) => {
    e.preventDefault();
    setTried(true);
    if (Object.keys(problems).length) {
      setStatus('Not saved: see the message by the field.');
      return;
    }
    const now = saveExaminer(localStorage, draft);
    setSaved(now);
    setTried(false);
    setStatus(
      now
        ? `Saved: readings from now on are signed ${now.name}${now.qualification ? ` (${now.qualification})` : ''}.`
        : 'Saved: no examiner named; readings from now on carry no examiner.',
    );
  };
  return (
    <form class="setting examiner" onSubmit={save} aria-labelledby="examiner-title" noValidate>
      <h2 id="examiner-title">Examiner</h2>
      <p>
        {saved
          ? `Readings and new rounds are signed ${saved.name}${saved.qualification ? ` (${saved.qualification})` : ''}.`
          : 'No examiner named yet: readings are saved without a name.'}
      </p>
      <TextField
        label="Name"
        value={draft.name}
        onChange={(name) => setDraft((d) => ({ ...d, name }))}
        error={shown.name}
        hint="As it should appear on the inspection record; leave empty to name nobody"
        autoComplete="name"
      />
      <TextField
        label="Qualification"
        value={draft.qualification}
        onChange={(qualification) => setDraft((d) => ({ ...d, qualification }))}
        error={shown.qualification}
        hint="e.g. the certification and level held for visual testing"
      />
      <div class="actions">
        <button type="submit" class="primary">
          Save examiner
        </button>
      </div>
      <p role="status">{status}</p>
    </form>
  );
}
