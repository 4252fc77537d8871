import type { FatFlag, LifeEstimate, SeamAssessment } from '../domain/index.js';

const n3 = (x: number): string => String(Number(x.toPrecision(3)));
const n4 = (x: number): string => String(Number(x.toPrecision(4)));
const sci = (x: number): string => (Number.isFinite(x) ? x.toExponential(2) : 'unlimited');
const FLAG: Record<FatFlag, string> = { meets: 'MEETS', below: 'BELOW', notAssessable: 'NOT ASSESSABLE' };

function lifeText(life: LifeEstimate | { notAssessed: string }): string {
  if ('notAssessed' in life) return `not assessed (${life.notAssessed})`;
  const req =
    life.requiredCycles === null
      ? ''
      : ` against ${sci(life.requiredCycles)} required → ${life.meets ? 'meets' : 'DOES NOT MEET'}`;
  return `${sci(life.cycles)} cycles at Δσ = ${n3(life.stressRange)} MPa${req}`;
}

/** The short readable section the grader prints after the grade: km, toes, FAT, life, drivers, sampling. */
export function formatAssessment(a: SeamAssessment): string {
  const out: string[] = [`Fatigue assessment (indicative; round ${a.round ?? '—'})`];
  const m = a.misalignment;
  if (m.kmCalc !== null) {
    const cov = m.kmCovered
      ? `; covered by the class ${n3(m.kmCovered.value)} (${m.kmCovered.label}); km,eff ${n4(m.kmEff ?? 1)}`
      : '';
    const dnv = m.dnv ? `; DNV form ${n4(m.dnv.scf)}` : '';
    const at = m.governingSurface
      ? ` at plate ${m.governingSurface.plate} ${m.governingSurface.surface} surface`
      : '';
    out.push(`km: ${n4(m.kmCalc)}${at}${cov}${dnv}`);
  } else {
    out.push(`km: ${m.state}${m.missing.length ? ` (missing: ${m.missing.join('; ')})` : ''}`);
  }
  if (a.toes.toes.length) {
    out.push('Toes, most likely crack site first:');
    for (const t of a.toes.toes) {
      const r = t.range;
      const k = r ? (r.min === r.max ? n4(r.max) : `${n4(r.min)}–${n4(r.max)}`) : '—';
      const flags = [
        r?.extrapolated ? 'outside every formula’s range' : '',
        t.governing.radiusBasis === 'measured' ? '' : 'radius not measured here',
      ]
        .filter(Boolean)
        .join(', ');
      out.push(
        `  ${t.rank}. ${t.label} at ${t.governing.position} mm: Kt,eff ${k} (b = ${t.bendingRatio >= 0 ? '+' : ''}${n3(t.bendingRatio)}, ${t.secondaryBending})${flags ? ` [${flags}]` : ''}`,
      );
    }
  }
  if (a.toes.note) out.push(`  Note: ${a.toes.note}`);
  const f = a.fatigue;
  const g = f.governing;
  const fatText = g
    ? `detail ${g.id} (FAT ${g.fat}${g.thicknessFactor < 1 ? ` × ${n3(g.thicknessFactor)}` : ''})${f.fatEquivalent !== null ? ` → equivalent ${n3(f.fatEquivalent)} MPa` : ''}`
    : 'no class';
  const req = f.requiredFat ? `; required ${f.requiredFat.value} MPa` : '';
  out.push(
    `FAT: ${fatText}${req} → ${FLAG[f.flag]}${f.missing.length ? ` (missing: ${f.missing.join('; ')})` : ''}`,
  );
  if (f.earned.why.length)
    out.push(`  Class earned: ${f.earned.details.join(', ') || 'none'} — ${f.earned.why.join('; ')}`);
  if (f.designDetail?.note) out.push(`  Drawing: ${f.designDetail.note}`);
  out.push(`Life: ${lifeText(f.life)}`);
  const en = a.effectiveNotch;
  out.push(
    `Effective notch: ${en.basis}; ${en.fatEquivalent !== null ? `equivalent ${n3(en.fatEquivalent)} MPa` : 'not rated'} → ${FLAG[en.flag]}`,
  );
  for (const t of en.toes)
    if (t.outside.length) out.push(`  ${t.label}: outside validity — ${t.outside.join('; ')}`);
  const drivers = a.sensitivity.rows.filter((r) => r.magnitude > 0).slice(0, 3);
  if (drivers.length) {
    const unit = (r: (typeof drivers)[number]): string => (r.unit === 'deg' ? '°' : ' mm');
    out.push(
      `What drives it (by ${a.sensitivity.rankedBy}): ${drivers
        .map(
          (r) =>
            `${r.input} ${r.where} ±${r.uncertainty}${unit(r)} → ${a.sensitivity.rankedBy === 'life' ? `life ±${n3(100 * r.magnitude)} %` : `Kt ±${n3(r.magnitude)}`}`,
        )
        .join('; ')}`,
    );
  }
  if (a.sampling.parameters.length) {
    out.push('Sampling (at-pitch readings only):');
    for (const p of a.sampling.parameters) out.push(`  ${p.advice}`);
  }
  out.push(`Caution: ${a.caution}`);
  return out.join('\n');
}
