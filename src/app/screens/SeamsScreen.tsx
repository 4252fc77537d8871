import { useEffect, useRef, useState } from 'preact/hooks';
import type { DecisionRecord, SeamRecord } from '../../store/api.js';
import { decisionLine, DECISION_TEXT } from '../components/decision-text.js';
import { LevelBadge } from '../components/LevelBadge.js';
import { requiredLevelOf } from '../components/required-level.js';
import { matchesSearch, sortSeams } from '../components/seam-search.js';
import { needsRegrade, regradeOrder, sameSummary, summaryFromGrade } from '../components/summary.js';
import { hrefOf } from '../router.js';
import { entryCheckWorker } from '../services/entry-check.js';
import { getStore } from '../services/store.js';
import { onPulled } from '../services/pull-events.js';

type Load =
  | { state: 'loading' }
  | { state: 'failed'; message: string }
  | { state: 'ready'; seams: SeamRecord[]; linked: ReadonlyMap<string, string[]> };

/** Tags linked by scanning, per seam, so the search box finds a seam by them too. */
function linkedBySeam(links: readonly { seamId: string; tag: string }[]): Map<string, string[]> {
  const map = new Map<string, string[]>();
  for (const l of links) map.set(l.seamId, [...(map.get(l.seamId) ?? []), l.tag]);
  return map;
}

const errorText = (e: unknown) => (e instanceof Error ? e.message : String(e));

/**
 * Grades every seam again in the worker, those with a missing or outdated summary first, and stores a summary
 * that changed. All of them, because new readings and checklist answers do not mark the seam as changed. One
 * seam at a time, so the list stays usable while it runs.
 */
async function refreshSummaries(
  seams: readonly SeamRecord[],
  onUpdated: (rec: SeamRecord) => void,
  alive: () => boolean,
) {
  const store = await getStore();
  for (const rec of regradeOrder(seams)) {
    if (!alive()) return;
    const file = await store.seamFile(rec.id);
    if (!file) continue;
    // The standing alone (no grade per reading): the page receives a few hundred bytes however long the seam is.
    const reply = await entryCheckWorker().standing(file);
    if (!reply.ok) continue;
    const summary = summaryFromGrade(reply.standing, new Date().toISOString());
    if (sameSummary(rec.summary, summary) && !needsRegrade(rec)) continue;
    await store.setSummary(rec.id, summary);
    onUpdated({ ...rec, summary });
  }
}

function Welcome({ onDemo, busy }: { readonly onDemo: () => void; readonly busy: boolean }) {
  return (
    <section class="welcome" aria-labelledby="welcome-title">
      <h1 id="welcome-title">Welcome to Beadbook</h1>
      <p>
        Record gauge readings along a weld seam, answer the visual checklist, and see the ISO 5817 level the
        seam meets. Everything stays on this device until it is synced.
      </p>
      <div class="actions">
        <button type="button" class="primary" onClick={onDemo} disabled={busy}>
          {busy ? 'Loading the demo yard…' : 'Load the demo yard'}
        </button>
        <a class="button" href={hrefOf({ name: 'seamNew' })}>
          Set up a seam
        </a>
      </div>
      <p class="note">
        The demo yard is a few example seams to try the app with. They are marked “demo”, never sync, and can
        be removed in Settings.
      </p>
    </section>
  );
}

function SeamRow({
  rec,
  decision,
}: {
  readonly rec: SeamRecord;
  readonly decision: DecisionRecord | undefined;
}) {
  const { seam, summary } = rec;
  const required = requiredLevelOf(seam);
  const preset = seam.acceptance.preset;
  return (
    <li class="seam-row">
      <a class="seam-link" href={hrefOf({ name: 'seam', id: rec.id })}>
        <span class="seam-label">
          {seam.label}
          {rec.namespace === 'demo' ? <span class="tag tag-demo">demo</span> : null}
        </span>
        <span class="seam-meta">
          {seam.tags?.length ? <span>Tags: {seam.tags.join(', ')}</span> : null}
          {seam.drawing ? (
            <span>
              Drawing {seam.drawing}
              {seam.drawingPosition ? ` / ${seam.drawingPosition}` : ''}
            </span>
          ) : null}
          {seam.welder ? <span>Welder {seam.welder}</span> : null}
          <span>Required {preset ? `${preset} (${required})` : required}</span>
        </span>
        {decision ? (
          <span class="seam-decision" data-outcome={decision.outcome}>
            <span aria-hidden="true">{DECISION_TEXT[decision.outcome].mark} </span>
            {decisionLine(decision)}
            <span class="tag tag-new">new</span>
          </span>
        ) : null}
        <span class="seam-level">
          {summary ? (
            <LevelBadge
              levelMet={summary.levelMet}
              required={required}
              meets={summary.meetsRequired}
              state={summary.state}
            />
          ) : (
            <span class="badge badge-open">
              <span aria-hidden="true" class="badge-shape">
                ◌
              </span>{' '}
              grading…
            </span>
          )}
        </span>
      </a>
    </li>
  );
}

const FIRST_SCREEN_MARK = 'beadbook:first-screen';

/** The first screen: every seam on this device, one search box, the level of each at a glance. */
export function SeamsScreen() {
  const [load, setLoad] = useState<Load>({ state: 'loading' });
  const [query, setQuery] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [unseen, setUnseen] = useState<Map<string, DecisionRecord>>(() => new Map());

  const mounted = useRef(true);
  useEffect(
    () => () => {
      mounted.current = false;
    },
    [],
  );

  const reload = async () => {
    try {
      const store = await getStore();
      const [listed, decisions, links] = await Promise.all([
        store.listSeams(),
        store.unseenDecisions(),
        store.listTagLinks(),
      ]);
      const seams = sortSeams(listed);
      setUnseen(decisions);
      setLoad({ state: 'ready', seams, linked: linkedBySeam(links) });
      // npm run bench:app times the cold start to this mark: the list is read from storage and on screen.
      if (!performance.getEntriesByName(FIRST_SCREEN_MARK).length) {
        requestAnimationFrame(() => performance.mark(FIRST_SCREEN_MARK));
      }
      const update = (rec: SeamRecord) =>
        setLoad((l) =>
          l.state === 'ready' ? { ...l, seams: l.seams.map((s) => (s.id === rec.id ? rec : s)) } : l,
        );
      void refreshSummaries(seams, update, () => mounted.current).catch((e: unknown) =>
        setError(`Some levels could not be brought up to date: ${errorText(e)}`),
      );
    } catch (e) {
      setLoad({ state: 'failed', message: errorText(e) });
    }
  };

  useEffect(() => {
    void reload();
    // Decisions and assigned seams arrive with a pull: show them when they do.
    const unsubscribe = onPulled((outcome) => {
      if (outcome.kind === 'pulled' && (outcome.applied.decisions || outcome.applied.assignments))
        void reload();
    });
    return () => unsubscribe();
  }, []);

  const loadDemo = async () => {
    setBusy(true);
    setError(null);
    try {
      await (await getStore()).loadDemo();
      await reload();
    } catch (e) {
      setError(`The demo yard could not be loaded: ${errorText(e)}`);
    } finally {
      setBusy(false);
    }
  };

  if (load.state === 'loading') return <p aria-busy="true">Loading seams…</p>;
  if (load.state === 'failed') {
    return (
      <p role="alert" class="banner banner-bad">
        ⚠ The seams on this device could not be read ({load.message}). Reload the app to try again.
      </p>
    );
  }
  if (!load.seams.length) {
    return (
      <>
        {error ? (
          <p role="alert" class="banner banner-bad">
            ⚠ {error}
          </p>
        ) : null}
        <Welcome onDemo={() => void loadDemo()} busy={busy} />
        <p>
          <a class="button" href={hrefOf({ name: 'tag' })}>
            Scan tag
          </a>
        </p>
      </>
    );
  }
  const { linked } = load;
  const shown = load.seams.filter((s) => matchesSearch(s, query, linked.get(s.id)));
  return (
    <section aria-labelledby="seams-title" class="seams">
      <div class="screen-head">
        <h1 id="seams-title">Seams</h1>
        <a class="button primary" href={hrefOf({ name: 'tag' })}>
          Scan tag
        </a>
        <a class="button" href={hrefOf({ name: 'seamNew' })}>
          + Set up a seam
        </a>
        <a class="button" href={hrefOf({ name: 'tagSheet', seamIds: [] })}>
          Print tag labels
        </a>
      </div>
      {error ? (
        <p role="alert" class="banner banner-bad">
          ⚠ {error}
        </p>
      ) : null}
      <div class="search">
        <label for="seam-search">Search by label, tag, drawing or welder</label>
        <input
          id="seam-search"
          type="search"
          value={query}
          autoComplete="off"
          onInput={(e) => setQuery((e.target as HTMLInputElement).value)}
        />
      </div>
      <p class="note" aria-live="polite">
        {query.trim() ? `${shown.length} of ${load.seams.length} seams match` : `${load.seams.length} seams`}
      </p>
      <ul class="seam-list">
        {shown.map((rec) => (
          <SeamRow key={rec.id} rec={rec} decision={unseen.get(rec.id)} />
        ))}
      </ul>
    </section>
  );
}
