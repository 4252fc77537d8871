import { EXECUTION_CLASS_PRESETS } from '../criteria/presets.js';
import type { Level } from '../model/levels.js';
import type { Seam } from '../model/seam-file.js';

export interface RequiredLevels {
  readonly base: Level;
  /** Required level for an imperfection, from its ISO 6520-1 references (the first override found governs). */
  forRefs(refs: readonly string[]): Level;
  readonly presetNote?: string;
}

export function requiredLevels(seam: Seam): RequiredLevels {
  const { preset, level, overrides } = seam.acceptance;
  const p = preset ? EXECUTION_CLASS_PRESETS[preset] : undefined;
  // Validation guarantees a level or a preset.
  const base = (level ?? p?.level ?? 'B') as Level;
  const merged: Record<string, Level> = { ...(p?.overrides ?? {}), ...(overrides ?? {}) };
  const forRefs = (refs: readonly string[]): Level => {
    for (const r of refs) {
      const o = merged[r];
      if (o) return o;
    }
    return base;
  };
  return p?.note ? { base, forRefs, presetNote: p.note } : { base, forRefs };
}
