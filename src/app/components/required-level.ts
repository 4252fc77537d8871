import { EXECUTION_CLASS_PRESETS } from '../../domain/criteria/presets.js';
import type { Level } from '../../domain/model/levels.js';
import type { Seam } from '../../domain/model/seam-file.js';

// Imported from the small domain modules directly: the Seams list is in the first paint and stays light.

/** The base level a seam asks for: its level, or its execution class's. */
export function requiredLevelOf(seam: Seam): Level {
  const { level, preset } = seam.acceptance;
  return level ?? (preset ? EXECUTION_CLASS_PRESETS[preset].level : 'B');
}

/** "level C; 5011 at D", or "EXC2 (level C, 506, 601, 2025, 5011, 5012 at D)": what the seam asks for, in words. */
export function requiredText(seam: Seam): string {
  const { level, preset, overrides } = seam.acceptance;
  const own = Object.entries(overrides ?? {});
  const extra = own.length ? `; ${own.map(([ref, l]) => `${ref} at ${l}`).join(', ')}` : '';
  if (preset) {
    const p = EXECUTION_CLASS_PRESETS[preset];
    const refs = Object.keys(p.overrides).sort((a, b) => Number(a) - Number(b));
    const relaxed = refs.length ? `, ${refs.join(', ')} at D` : '';
    return `${preset} (level ${p.level}${relaxed})${extra}`;
  }
  return `level ${level ?? 'B'}${extra}`;
}
