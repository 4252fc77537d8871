import { DEFAULT_PITCH, type AfterSave } from './positions.js';
import { isInstrumentKey, type InstrumentKey } from './instruments.js';
import { storageHelpers, type KeyValueStore } from './instrument-settings.js';

// Small choices the screen remembers on this device between visits.
const PITCH_KEY = 'beadbook.gauge.pitch';
const INSTRUMENT_KEY = 'beadbook.gauge.instrument';
const AFTER_SAVE_KEY = 'beadbook.gauge.afterSave';

export function rememberedPitch(store: KeyValueStore): number {
  const n = Number(storageHelpers.safeGet(store, PITCH_KEY));
  return Number.isFinite(n) && n > 0 ? n : DEFAULT_PITCH;
}

export const rememberPitch = (store: KeyValueStore, pitch: number): void =>
  storageHelpers.safeSet(store, PITCH_KEY, String(pitch));

export function rememberedInstrument(store: KeyValueStore): InstrumentKey | null {
  const k = storageHelpers.safeGet(store, INSTRUMENT_KEY);
  return isInstrumentKey(k) ? k : null;
}

export const rememberInstrument = (store: KeyValueStore, key: InstrumentKey): void =>
  storageHelpers.safeSet(store, INSTRUMENT_KEY, key);

export function rememberedAfterSave(store: KeyValueStore): AfterSave {
  const v = storageHelpers.safeGet(store, AFTER_SAVE_KEY);
  return v === 'nextToe' || v === 'stay' ? v : 'nextPosition';
}

export const rememberAfterSave = (store: KeyValueStore, a: AfterSave): void =>
  storageHelpers.safeSet(store, AFTER_SAVE_KEY, a);
