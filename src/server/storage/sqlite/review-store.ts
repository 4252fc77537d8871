// The review's statements (decisions, review facts, the queue), kept beside the sync statements in
// sqlite-storage.ts, which delegates to this. Same rules: constant statement text prepared once, every value bound
// as a parameter. The queue's filters and its sort order are parameters too: a filter that is not set binds null
// (or 0) and drops out of the WHERE clause; the sort key picks one CASE branch of the ORDER BY.
import type {
  ChangeRow,
  Choice,
  DecisionOutcomeOfAdd,
  DecisionRow,
  NewDecision,
  ReviewChoices,
  ReviewFacts,
  ReviewFlag,
  ReviewQuery,
  ReviewQueuePage,
  ReviewQueueRow,
} from '../types.js';
import { toChange, type ChangeDbRow } from './change-rows.js';
import type { Db } from './open.js';

interface FactsRow {
  seam_id: string;
  namespace: 'live' | 'demo';
  label: string;
  tags: string;
  organisation: string | null;
  area: string | null;
  drawing: string | null;
  welder: string | null;
  procedure: string | null;
  required_level: string | null;
  edition: string | null;
  state: string;
  level_met: string | null;
  level_rank: number | null;
  meets_required: number | null;
  graded_round: number | null;
  latest_round: number | null;
  reading_count: number;
  borderline_count: number;
  fat_flag: ReviewFacts['fatFlag'];
  sampling_adequate: number | null;
  unverified_rows: number;
  device_level_met: string | null;
  grade_mismatch: number;
  inspected_first: string | null;
  inspected_last: string | null;
  last_received_at: string | null;
  based_on: number;
  graded_at: string;
  computed_at: string;
}

interface QueueDbRow extends FactsRow {
  decision_id: string | null;
  decision_outcome: DecisionRow['outcome'] | null;
  decision_round: number | null;
  decision_at: string | null;
  decision_by: string | null;
  reviewed: number;
}

interface DecisionDbRow {
  seq: number;
  id: string;
  seam_id: string;
  round: number;
  outcome: DecisionRow['outcome'];
  comment: string | null;
  decided_by: number;
  decided_by_name: string;
  decided_at: string;
  based_on: number;
  server_level_met: string | null;
  jws: string;
  change_seq: number;
}

/** Tags are kept as one text column (shown and searched, never filtered one by one). */
const TAG_SEPARATOR = '\u001f';

const bool = (n: number | null): boolean | null => (n === null ? null : n === 1);
const bit = (b: boolean | null): number | null => (b === null ? null : b ? 1 : 0);

function toFacts(r: FactsRow, inspectors: readonly string[]): ReviewFacts {
  return {
    seamId: r.seam_id,
    namespace: r.namespace,
    label: r.label,
    tags: r.tags === '' ? [] : r.tags.split(TAG_SEPARATOR),
    organisation: r.organisation,
    area: r.area,
    drawing: r.drawing,
    welder: r.welder,
    procedure: r.procedure,
    requiredLevel: r.required_level,
    edition: r.edition,
    state: r.state,
    levelMet: r.level_met,
    levelRank: r.level_rank,
    meetsRequired: bool(r.meets_required),
    gradedRound: r.graded_round,
    latestRound: r.latest_round,
    readingCount: r.reading_count,
    borderlineCount: r.borderline_count,
    fatFlag: r.fat_flag,
    samplingAdequate: bool(r.sampling_adequate),
    unverifiedRows: r.unverified_rows,
    deviceLevelMet: r.device_level_met,
    gradeMismatch: r.grade_mismatch === 1,
    inspectedFirst: r.inspected_first,
    inspectedLast: r.inspected_last,
    lastReceivedAt: r.last_received_at,
    basedOn: r.based_on,
    gradedAt: r.graded_at,
    computedAt: r.computed_at,
    inspectors,
  };
}

const withoutInspectors = ({ inspectors: _none, ...facts }: ReviewFacts): Omit<ReviewFacts, 'inspectors'> =>
  facts;

const toDecision = (r: DecisionDbRow): DecisionRow => ({
  seq: r.seq,
  id: r.id,
  seamId: r.seam_id,
  round: r.round,
  outcome: r.outcome,
  comment: r.comment,
  decidedBy: r.decided_by,
  decidedByName: r.decided_by_name,
  decidedAt: r.decided_at,
  basedOn: r.based_on,
  serverLevelMet: r.server_level_met,
  jws: r.jws,
  changeSeq: r.change_seq,
});

/** The newest decision per seam, and whether it covers every record the facts were made from. */
const LATEST_DECISION = `
  LEFT JOIN decisions d ON d.seq = (SELECT max(x.seq) FROM decisions x WHERE x.seam_id = f.seam_id)`;

/** The filters other than the flags (what the counts per flag are counted within). */
const SCOPE = `
  (@welder IS NULL OR f.welder = @welder)
  AND (@procedure IS NULL OR f.procedure = @procedure)
  AND (@drawing IS NULL OR f.drawing = @drawing)
  AND (@area IS NULL OR f.area = @area)
  AND (@device IS NULL OR EXISTS (
    SELECT 1 FROM device_seams ds WHERE ds.seam_id = f.seam_id AND ds.device_kid = @device))
  AND (@inspector IS NULL OR EXISTS (
    SELECT 1 FROM review_inspectors i WHERE i.seam_id = f.seam_id AND i.name = @inspector))
  AND (@from IS NULL OR f.inspected_last >= @from)
  AND (@to IS NULL OR f.inspected_first <= @to)
  AND (@text IS NULL OR instr(lower(f.label), @text) > 0 OR instr(lower(f.seam_id), @text) > 0
    OR instr(lower(f.tags), @text) > 0)`;

const REVIEWED = '(d.based_on IS NOT NULL AND d.based_on >= f.based_on)';

const FLAG_SQL: Record<ReviewFlag, string> = {
  belowRequired: 'f.meets_required = 0',
  fatBelow: "f.fat_flag = 'below'",
  samplingShort: 'f.sampling_adequate = 0',
  borderline: 'f.borderline_count > 0',
  // A seam with no record yet has nothing to review.
  unreviewed: `(f.based_on > 0 AND NOT ${REVIEWED})`,
};

const FLAGS = `
  (@belowRequired = 0 OR ${FLAG_SQL.belowRequired})
  AND (@fatBelow = 0 OR ${FLAG_SQL.fatBelow})
  AND (@samplingShort = 0 OR ${FLAG_SQL.samplingShort})
  AND (@borderline = 0 OR ${FLAG_SQL.borderline})
  AND (@unreviewed = 0 OR ${FLAG_SQL.unreviewed})`;

// One CASE per direction, as SQLite cannot bind ASC/DESC; seams without the value (not graded, no welder) come
// last either way. Ties fall back to the label, then the id, so paging is stable.
const SORT_KEY = `CASE @sort
    WHEN 'label' THEN lower(f.label)
    WHEN 'level' THEN f.level_rank
    WHEN 'required' THEN f.required_level
    WHEN 'welder' THEN lower(f.welder)
    WHEN 'procedure' THEN lower(f.procedure)
    WHEN 'drawing' THEN lower(f.drawing)
    WHEN 'area' THEN lower(f.area)
    WHEN 'inspected' THEN f.inspected_last
    WHEN 'received' THEN f.based_on
    WHEN 'borderline' THEN f.borderline_count
    WHEN 'decision' THEN d.seq
  END`;

const QUEUE_SQL = `
SELECT f.*, d.id AS decision_id, d.outcome AS decision_outcome, d.round AS decision_round,
  d.decided_at AS decision_at, d.decided_by_name AS decision_by, ${REVIEWED} AS reviewed
FROM review_facts f ${LATEST_DECISION}
WHERE ${SCOPE} AND ${FLAGS}
ORDER BY (${SORT_KEY}) IS NULL,
  CASE WHEN @descending = 0 THEN ${SORT_KEY} END ASC,
  CASE WHEN @descending = 1 THEN ${SORT_KEY} END DESC,
  lower(f.label), f.seam_id
LIMIT @limit OFFSET @offset`;

const COUNTS_SQL = `
SELECT count(*) AS scope,
  coalesce(sum(CASE WHEN ${FLAGS} THEN 1 ELSE 0 END), 0) AS total,
  coalesce(sum(${FLAG_SQL.belowRequired}), 0) AS belowRequired,
  coalesce(sum(${FLAG_SQL.fatBelow}), 0) AS fatBelow,
  coalesce(sum(${FLAG_SQL.samplingShort}), 0) AS samplingShort,
  coalesce(sum(${FLAG_SQL.borderline}), 0) AS borderline,
  coalesce(sum(${FLAG_SQL.unreviewed}), 0) AS unreviewed
FROM review_facts f ${LATEST_DECISION}
WHERE ${SCOPE}`;

const SELECTION_SQL = `
SELECT f.seam_id AS id FROM review_facts f ${LATEST_DECISION}
WHERE ${SCOPE} AND ${FLAGS}
ORDER BY (${SORT_KEY}) IS NULL,
  CASE WHEN @descending = 0 THEN ${SORT_KEY} END ASC,
  CASE WHEN @descending = 1 THEN ${SORT_KEY} END DESC,
  lower(f.label), f.seam_id
LIMIT @limit`;

const choicesOf = (column: 'welder' | 'procedure' | 'drawing' | 'area') =>
  `SELECT ${column} AS value, ${column} AS label, count(*) AS count FROM review_facts
   WHERE ${column} IS NOT NULL GROUP BY ${column} ORDER BY lower(${column})`;

type Bound = Record<string, string | number | null>;

function bind(q: Omit<ReviewQuery, 'offset' | 'limit'>): Bound {
  const has = (flag: ReviewFlag) => (q.flags.includes(flag) ? 1 : 0);
  return {
    welder: q.welder,
    procedure: q.procedure,
    drawing: q.drawing,
    area: q.area,
    device: q.deviceKid,
    inspector: q.inspector,
    from: q.from,
    to: q.to,
    text: q.text === null ? null : q.text.toLowerCase(),
    belowRequired: has('belowRequired'),
    fatBelow: has('fatBelow'),
    samplingShort: has('samplingShort'),
    borderline: has('borderline'),
    unreviewed: has('unreviewed'),
    sort: q.sort,
    descending: q.descending ? 1 : 0,
  };
}

export class ReviewStatements {
  readonly #db: Db;
  readonly #s;

  constructor(db: Db) {
    this.#db = db;
    const p = (sql: string) => db.prepare(sql);
    this.#s = {
      latestRecordSeq: p('SELECT coalesce(max(receive_seq), 0) AS seq FROM records WHERE seam_id = ?'),
      latestDecision: p('SELECT id FROM decisions WHERE seam_id = ? ORDER BY seq DESC LIMIT 1'),
      insertChange: p(
        `INSERT INTO changes (kind, item_id, seam_id, device_kid, item, created_at, created_by)
         VALUES ('decision', ?, ?, NULL, ?, ?, ?)`,
      ),
      changeBySeq: p('SELECT * FROM changes WHERE seq = ?'),
      insertDecision: p(
        `INSERT INTO decisions (id, seam_id, round, outcome, comment, decided_by, decided_by_name, decided_at,
           based_on, server_level_met, jws, change_seq)
         VALUES (@id, @seamId, @round, @outcome, @comment, @decidedBy, @decidedByName, @decidedAt, @basedOn,
           @serverLevelMet, @jws, @changeSeq)`,
      ),
      decision: p('SELECT * FROM decisions WHERE id = ?'),
      decisionBySeq: p('SELECT * FROM decisions WHERE seq = ?'),
      decisionsOfSeam: p('SELECT * FROM decisions WHERE seam_id = ? ORDER BY seq'),
      changesOfSeam: p('SELECT * FROM changes WHERE seam_id = ? ORDER BY seq'),
      batchIdsOfSeam: p(
        `SELECT batch_id AS id FROM records WHERE seam_id = ? AND batch_id IS NOT NULL
         GROUP BY batch_id ORDER BY min(receive_seq)`,
      ),
      saveFacts: p(
        `INSERT INTO review_facts (seam_id, namespace, label, tags, organisation, area, drawing, welder, procedure,
           required_level, edition, state, level_met, level_rank, meets_required, graded_round, latest_round,
           reading_count, borderline_count, fat_flag, sampling_adequate, unverified_rows, device_level_met,
           grade_mismatch, inspected_first, inspected_last, last_received_at, based_on, graded_at, computed_at)
         VALUES (@seam_id, @namespace, @label, @tags, @organisation, @area, @drawing, @welder, @procedure,
           @required_level, @edition, @state, @level_met, @level_rank, @meets_required, @graded_round,
           @latest_round, @reading_count, @borderline_count, @fat_flag, @sampling_adequate, @unverified_rows,
           @device_level_met, @grade_mismatch, @inspected_first, @inspected_last, @last_received_at, @based_on,
           @graded_at, @computed_at)
         ON CONFLICT (seam_id) DO UPDATE SET namespace = excluded.namespace, label = excluded.label,
           tags = excluded.tags, organisation = excluded.organisation, area = excluded.area,
           drawing = excluded.drawing, welder = excluded.welder, procedure = excluded.procedure,
           required_level = excluded.required_level, edition = excluded.edition, state = excluded.state,
           level_met = excluded.level_met, level_rank = excluded.level_rank,
           meets_required = excluded.meets_required, graded_round = excluded.graded_round,
           latest_round = excluded.latest_round, reading_count = excluded.reading_count,
           borderline_count = excluded.borderline_count, fat_flag = excluded.fat_flag,
           sampling_adequate = excluded.sampling_adequate, unverified_rows = excluded.unverified_rows,
           device_level_met = excluded.device_level_met, grade_mismatch = excluded.grade_mismatch,
           inspected_first = excluded.inspected_first, inspected_last = excluded.inspected_last,
           last_received_at = excluded.last_received_at, based_on = excluded.based_on,
           graded_at = excluded.graded_at, computed_at = excluded.computed_at
         WHERE excluded.based_on > review_facts.based_on
           OR (excluded.based_on = review_facts.based_on AND excluded.graded_at >= review_facts.graded_at)`,
      ),
      deleteInspectors: p('DELETE FROM review_inspectors WHERE seam_id = ?'),
      insertInspector: p(
        'INSERT INTO review_inspectors (seam_id, name) VALUES (?, ?) ON CONFLICT DO NOTHING',
      ),
      facts: p('SELECT * FROM review_facts WHERE seam_id = ?'),
      inspectorsOf: p('SELECT name FROM review_inspectors WHERE seam_id = ? ORDER BY name'),
      staleFacts: p(
        `SELECT g.seam_id AS id FROM server_grades g LEFT JOIN review_facts f ON f.seam_id = g.seam_id
         WHERE f.seam_id IS NULL OR f.based_on < g.based_on OR f.graded_at < g.graded_at
         ORDER BY g.seam_id`,
      ),
      queue: p(QUEUE_SQL),
      counts: p(COUNTS_SQL),
      selection: p(SELECTION_SQL),
      welders: p(choicesOf('welder')),
      procedures: p(choicesOf('procedure')),
      drawings: p(choicesOf('drawing')),
      areas: p(choicesOf('area')),
      devices: p(
        `SELECT d.kid AS value, d.name AS label, count(f.seam_id) AS count FROM devices d
         JOIN device_seams ds ON ds.device_kid = d.kid JOIN review_facts f ON f.seam_id = ds.seam_id
         GROUP BY d.kid ORDER BY lower(d.name), d.kid`,
      ),
      inspectors: p(
        `SELECT name AS value, name AS label, count(*) AS count FROM review_inspectors
         GROUP BY name ORDER BY lower(name)`,
      ),
    };
  }

  latestRecordSeq(seamId: string): number {
    return (this.#s.latestRecordSeq.get(seamId) as { seq: number }).seq;
  }

  addDecision(d: NewDecision): DecisionOutcomeOfAdd {
    const s = this.#s;
    return this.#db
      .transaction((): DecisionOutcomeOfAdd => {
        const latest = (s.latestDecision.get(d.seamId) as { id: string } | undefined)?.id ?? null;
        if (latest !== d.previousId) return { kind: 'stale', latestId: latest };
        const info = s.insertChange.run(d.id, d.seamId, d.item, d.decidedAt, d.decidedBy);
        const changeSeq = Number(info.lastInsertRowid);
        const inserted = s.insertDecision.run({
          id: d.id,
          seamId: d.seamId,
          round: d.round,
          outcome: d.outcome,
          comment: d.comment,
          decidedBy: d.decidedBy,
          decidedByName: d.decidedByName,
          decidedAt: d.decidedAt,
          basedOn: d.basedOn,
          serverLevelMet: d.serverLevelMet,
          jws: d.jws,
          changeSeq,
        });
        return {
          kind: 'added',
          decision: toDecision(s.decisionBySeq.get(inserted.lastInsertRowid) as DecisionDbRow),
          change: toChange(s.changeBySeq.get(changeSeq) as ChangeDbRow),
        };
      })
      .immediate();
  }

  getDecision(id: string): DecisionRow | undefined {
    const row = this.#s.decision.get(id) as DecisionDbRow | undefined;
    return row && toDecision(row);
  }

  listDecisions(seamId: string): DecisionRow[] {
    return (this.#s.decisionsOfSeam.all(seamId) as DecisionDbRow[]).map(toDecision);
  }

  listChangesOfSeam(seamId: string): ChangeRow[] {
    return (this.#s.changesOfSeam.all(seamId) as ChangeDbRow[]).map(toChange);
  }

  batchIdsOfSeam(seamId: string): string[] {
    return (this.#s.batchIdsOfSeam.all(seamId) as { id: string }[]).map((r) => r.id);
  }

  saveFacts(f: ReviewFacts): void {
    const s = this.#s;
    this.#db
      .transaction(() => {
        const info = s.saveFacts.run({
          seam_id: f.seamId,
          namespace: f.namespace,
          label: f.label,
          tags: f.tags.join(TAG_SEPARATOR),
          organisation: f.organisation,
          area: f.area,
          drawing: f.drawing,
          welder: f.welder,
          procedure: f.procedure,
          required_level: f.requiredLevel,
          edition: f.edition,
          state: f.state,
          level_met: f.levelMet,
          level_rank: f.levelRank,
          meets_required: bit(f.meetsRequired),
          graded_round: f.gradedRound,
          latest_round: f.latestRound,
          reading_count: f.readingCount,
          borderline_count: f.borderlineCount,
          fat_flag: f.fatFlag,
          sampling_adequate: bit(f.samplingAdequate),
          unverified_rows: f.unverifiedRows,
          device_level_met: f.deviceLevelMet,
          grade_mismatch: f.gradeMismatch ? 1 : 0,
          inspected_first: f.inspectedFirst,
          inspected_last: f.inspectedLast,
          last_received_at: f.lastReceivedAt,
          based_on: f.basedOn,
          graded_at: f.gradedAt,
          computed_at: f.computedAt,
        });
        // Older facts than those held change nothing, their inspectors included.
        if (info.changes === 0) return;
        s.deleteInspectors.run(f.seamId);
        for (const name of f.inspectors) s.insertInspector.run(f.seamId, name);
      })
      .immediate();
  }

  staleFacts(): string[] {
    return (this.#s.staleFacts.all() as { id: string }[]).map((r) => r.id);
  }

  getFacts(seamId: string): ReviewFacts | undefined {
    const row = this.#s.facts.get(seamId) as FactsRow | undefined;
    if (!row) return undefined;
    return toFacts(
      row,
      (this.#s.inspectorsOf.all(seamId) as { name: string }[]).map((r) => r.name),
    );
  }

  queue(q: ReviewQuery): ReviewQueuePage {
    return this.#db.transaction((): ReviewQueuePage => {
      const params = bind(q);
      const rows = (this.#s.queue.all({ ...params, limit: q.limit, offset: q.offset }) as QueueDbRow[]).map(
        (r): ReviewQueueRow => {
          return {
            ...withoutInspectors(toFacts(r, [])),
            decision:
              r.decision_id === null
                ? null
                : {
                    id: r.decision_id,
                    outcome: r.decision_outcome as DecisionRow['outcome'],
                    round: r.decision_round as number,
                    decidedAt: r.decision_at as string,
                    decidedByName: r.decision_by as string,
                  },
            reviewed: r.reviewed === 1,
          };
        },
      );
      const c = this.#s.counts.get(params) as Record<'scope' | 'total' | ReviewFlag, number>;
      return {
        rows,
        total: c.total,
        scope: c.scope,
        counts: {
          belowRequired: c.belowRequired,
          fatBelow: c.fatBelow,
          samplingShort: c.samplingShort,
          borderline: c.borderline,
          unreviewed: c.unreviewed,
        },
      };
    })();
  }

  selection(q: Omit<ReviewQuery, 'offset' | 'limit'>, max: number): string[] {
    return (this.#s.selection.all({ ...bind(q), limit: max }) as { id: string }[]).map((r) => r.id);
  }

  choices(): ReviewChoices {
    return this.#db.transaction(() => {
      const all = (statement: { all(): unknown[] }) => statement.all() as Choice[];
      return {
        welders: all(this.#s.welders),
        procedures: all(this.#s.procedures),
        drawings: all(this.#s.drawings),
        areas: all(this.#s.areas),
        devices: all(this.#s.devices),
        inspectors: all(this.#s.inspectors),
      };
    })();
  }
}
