import type { Reading } from '../../../domain/index.js';
import { INSTRUMENTS, instrumentDef, type InstrumentKey } from './instruments.js';

/** What the inspector sets once per session for the instrument in the hand; remembered on this device. */
export interface InstrumentSetting {
  readonly id: string;
  readonly resolutionMm?: number;
  readonly resolutionDeg?: number;
  /** ISO date (YYYY-MM-DD) of the last calibration. */
  readonly calibratedOn?: string;
}

export type InstrumentSettings = Readonly<Partial<Record<InstrumentKey, InstrumentSetting>>>;

/** The part of Web Storage these helpers use, so tests can pass a plain object. */
export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
}

export const SETTINGS_KEY = 'beadbook.gauge.instruments';
export const CONFIRMED_KEY = 'beadbook.gauge.instrumentsConfirmed';

const isPositive = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x) && x > 0;
const isDate = (x: unknown): x is string => typeof x === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(x);

/** Reads what was remembered, dropping anything malformed rather than failing the screen. */
export function parseSettings(raw: string | null): InstrumentSettings {
  if (!raw) return {};
  let data: unknown;
  try {
    data = JSON.parse(raw);
  } catch {
    return {};
  }
  if (typeof data !== 'object' || data === null) return {};
  const out: Partial<Record<InstrumentKey, InstrumentSetting>> = {};
  for (const def of INSTRUMENTS) {
    const s: unknown = (data as Record<string, unknown>)[def.key];
    if (typeof s !== 'object' || s === null) continue;
    const rec = s as Record<string, unknown>;
    if (typeof rec['id'] !== 'string') continue;
    const setting: { -readonly [K in keyof InstrumentSetting]: InstrumentSetting[K] } = { id: rec['id'] };
    if (isPositive(rec['resolutionMm'])) setting.resolutionMm = rec['resolutionMm'];
    if (isPositive(rec['resolutionDeg'])) setting.resolutionDeg = rec['resolutionDeg'];
    if (isDate(rec['calibratedOn'])) setting.calibratedOn = rec['calibratedOn'];
    out[def.key] = setting;
  }
  return out;
}

/** The setting to show for an instrument: the remembered one, or an empty id with the usual resolutions. */
export function settingFor(settings: InstrumentSettings, key: InstrumentKey): InstrumentSetting {
  const def = instrumentDef(key);
  const saved = settings[key];
  const base: { -readonly [K in keyof InstrumentSetting]: InstrumentSetting[K] } = { id: saved?.id ?? '' };
  const mm = saved?.resolutionMm ?? def.defaultResolution.mm;
  const deg = saved?.resolutionDeg ?? def.defaultResolution.deg;
  if (def.scales.mm && mm !== undefined) base.resolutionMm = mm;
  if (def.scales.deg && deg !== undefined) base.resolutionDeg = deg;
  if (saved?.calibratedOn) base.calibratedOn = saved.calibratedOn;
  return base;
}

export type SettingField = 'id' | 'resolutionMm' | 'resolutionDeg' | 'calibratedOn';

/**
 * What is wrong with a setting, per field, in plain words. The resolution decides "borderline", so it is
 * required; the record allows up to 10 mm or 10°. A calibration date after today is a typing slip.
 */
export function checkSetting(
  key: InstrumentKey,
  s: InstrumentSetting,
  today: string,
): Partial<Record<SettingField, string>> {
  const def = instrumentDef(key);
  const out: Partial<Record<SettingField, string>> = {};
  const id = s.id.trim();
  if (!id) out.id = `enter the ${def.name.toLowerCase()}'s id (as marked on it)`;
  else if (id.length > 64) out.id = 'the id can be at most 64 characters';
  if (def.scales.mm) {
    if (s.resolutionMm === undefined) out.resolutionMm = 'enter the smallest step the length scale shows';
    else if (!(s.resolutionMm > 0) || s.resolutionMm > 10)
      out.resolutionMm = 'must be more than 0 and at most 10 mm';
  }
  if (def.scales.deg) {
    if (s.resolutionDeg === undefined) out.resolutionDeg = 'enter the smallest step the angle scale shows';
    else if (!(s.resolutionDeg > 0) || s.resolutionDeg > 10)
      out.resolutionDeg = 'must be more than 0 and at most 10°';
  }
  if (s.calibratedOn !== undefined && s.calibratedOn !== '') {
    if (!isDate(s.calibratedOn) || Number.isNaN(Date.parse(s.calibratedOn))) {
      out.calibratedOn = 'enter a date such as 2026-03-01';
    } else if (s.calibratedOn > today) {
      out.calibratedOn = `the calibration date lies after today (${today})`;
    }
  }
  return out;
}

/** The instrument as the reading records it. */
export function readingInstrument(key: InstrumentKey, s: InstrumentSetting): Reading['instrument'] {
  const def = instrumentDef(key);
  const out: { -readonly [K in keyof Reading['instrument']]: Reading['instrument'][K] } = {
    id: s.id.trim(),
    kind: def.kind,
  };
  if (def.scales.mm && s.resolutionMm !== undefined) out.resolutionMm = s.resolutionMm;
  if (def.scales.deg && s.resolutionDeg !== undefined) out.resolutionDeg = s.resolutionDeg;
  if (s.calibratedOn) out.calibratedOn = s.calibratedOn;
  return out;
}

/** Today's date on this device as YYYY-MM-DD (local time: the date on the inspector's calendar). */
export function localDate(now: Date): string {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${p(now.getMonth() + 1)}-${p(now.getDate())}`;
}

export function loadSettings(store: KeyValueStore): InstrumentSettings {
  return parseSettings(safeGet(store, SETTINGS_KEY));
}

export function saveSetting(
  store: KeyValueStore,
  key: InstrumentKey,
  s: InstrumentSetting,
): InstrumentSettings {
  const next = { ...loadSettings(store), [key]: s };
  safeSet(store, SETTINGS_KEY, JSON.stringify(next));
  return next;
}

/** Instruments confirmed in this session (kept in session storage: a new session asks again, once). */
export function confirmedKeys(session: KeyValueStore): Set<InstrumentKey> {
  const raw = safeGet(session, CONFIRMED_KEY);
  try {
    const list: unknown = raw ? JSON.parse(raw) : [];
    return new Set(
      Array.isArray(list) ? list.filter((k): k is InstrumentKey => INSTRUMENTS.some((d) => d.key === k)) : [],
    );
  } catch {
    return new Set();
  }
}

export function confirmKey(session: KeyValueStore, key: InstrumentKey): Set<InstrumentKey> {
  const keys = confirmedKeys(session);
  keys.add(key);
  safeSet(session, CONFIRMED_KEY, JSON.stringify([...keys]));
  return keys;
}

// Storage can be unavailable (private mode, quota): the screen still works, it only forgets.
function safeGet(store: KeyValueStore, key: string): string | null {
  try {
    return store.getItem(key);
  } catch {
    return null;
  }
}

function safeSet(store: KeyValueStore, key: string, value: string): void {
  try {
    store.setItem(key, value);
  } catch {
    // Not remembered; the values stay on screen for this visit.
  }
}

export const storageHelpers = { safeGet, safeSet };
