import { levelText, type ImperfectionSummary, type RoundGrade, type SeamGrade } from '../domain/index.js';

const num = (x: number | null, unit: string): string =>
  x === null ? '—' : `${Number(x.toFixed(3))} ${unit}`;
const unitOf = (u: 'mm' | 'deg'): string => (u === 'deg' ? '°' : 'mm');

function pad(rows: string[][]): string {
  const widths = (rows[0] ?? []).map((_, c) => Math.max(...rows.map((r) => (r[c] ?? '').length)));
  return rows
    .map((r) =>
      r
        .map((cell, c) => cell.padEnd(widths[c] ?? 0))
        .join('  ')
        .trimEnd(),
    )
    .join('\n');
}

function imperfectionRows(list: readonly ImperfectionSummary[]): string {
  const head = [
    'Row',
    'ISO 6520-1',
    'Imperfection',
    'Worst at',
    'Value',
    'Limit',
    'Margin',
    'Met',
    'Req',
    'Verdict',
    'Limits',
  ];
  const rows = list.map((s) => {
    const u = unitOf(s.unit);
    const shortFail = s.shortRule
      .filter((c) => !c.passes)
      .map((c) => `short rule fails at ${c.level}: ${num(c.worstMm, 'mm')} in ${c.windowMm} mm`);
    return [
      s.row,
      s.refs.join(','),
      s.title + (shortFail.length ? ` [${shortFail.join('; ')}]` : ''),
      num(s.worst.position, 'mm'),
      num(s.worst.measured, u),
      num(s.worst.governingLimit, u),
      num(s.worst.margin, u) + (s.worst.borderline ? ' (borderline)' : ''),
      levelText(s.levelMet),
      s.required,
      s.meetsRequired ? 'meets' : 'FAILS',
      s.unverifiedLevels.length ? `unverified at ${s.unverifiedLevels.join(',')}` : s.limitStatus,
    ];
  });
  return pad([head, ...rows]);
}

function roundText(r: RoundGrade): string {
  const lines: string[] = [];
  const state = r.complete ? 'complete' : 'INCOMPLETE (checklist not fully answered)';
  lines.push(
    `Round ${r.round} (${r.kind}): ${state}; level met ${r.levelMet === null ? '—' : levelText(r.levelMet)}; ${r.readings.length} reading(s), ${r.borderlineCount} borderline`,
  );
  if (r.imperfections.length) lines.push(imperfectionRows(r.imperfections));
  const present = r.checklist.items.filter((i) => i.answer === 'present');
  const cl = [
    `Checklist: ${r.checklist.state}`,
    r.checklist.unanswered.length ? `unanswered: ${r.checklist.unanswered.join(', ')}` : '',
    r.checklist.notAccessible.length ? `not accessible: ${r.checklist.notAccessible.join(', ')}` : '',
    present.length
      ? `present: ${present.map((i) => `${i.label} at ${i.position ?? '?'} mm → ${levelText(i.levelMet ?? 'belowD')}${i.meetsRequired ? '' : ' FAILS'}`).join('; ')}`
      : '',
  ].filter(Boolean);
  lines.push(cl.join('; '));
  return lines.join('\n');
}

/** The human-readable report of a seam grade, for a terminal. */
export function formatGrade(g: SeamGrade): string {
  const out: string[] = [];
  const table = g.verifiedTable ? `verified table "${g.verifiedTable.name}"` : 'built-in limits';
  out.push(
    `Beadbook seam grade — ${g.edition} (${table}; ${g.unverifiedRows.length} row(s) in play unverified)`,
  );
  out.push(`Seam ${g.seamId} "${g.label}"`);
  const verdict =
    g.state === 'incomplete'
      ? 'INCOMPLETE — no round has a complete checklist; not a pass'
      : `level met ${levelText(g.levelMet ?? 'belowD')}, required ${g.requiredLevel} — ${g.meetsRequired ? 'MEETS the required level' : 'DOES NOT MEET the required level'} (round ${g.gradedRound})`;
  out.push(`Result: ${verdict}`);
  const graded = g.rounds.find((r) => r.round === g.gradedRound) ?? g.rounds[g.rounds.length - 1];
  if (graded?.worst) {
    const w = graded.worst;
    const u = unitOf(w.unit);
    out.push(
      `Worst position: ${num(w.position, 'mm')} — ${w.title}: ${num(w.measured, u)} against ${num(w.governingLimit, u)}, margin ${num(w.margin, u)}`,
    );
  }
  out.push('');
  for (const r of [...g.rounds].reverse()) out.push(roundText(r), '');
  if (g.unverifiedRows.length) out.push(`Unverified rows (recalled values): ${g.unverifiedRows.join(', ')}`);
  for (const n of g.notes) out.push(`Note: ${n}`);
  out.push('', `Caution: ${g.caution}`);
  return out.join('\n');
}
