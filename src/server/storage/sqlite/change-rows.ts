// What devices pull (assignments, decisions) as SQLite holds it, and as the storage API hands it out.
import type { ChangeRow } from '../types.js';

export interface ChangeDbRow {
  seq: number;
  kind: 'assignment' | 'decision';
  item_id: string;
  seam_id: string;
  device_kid: string | null;
  inspector_id: number | null;
  item: string;
  created_at: string;
}

export const toChange = (r: ChangeDbRow): ChangeRow => ({
  seq: r.seq,
  kind: r.kind,
  itemId: r.item_id,
  seamId: r.seam_id,
  deviceKid: r.device_kid,
  inspectorId: r.inspector_id,
  item: r.item,
  createdAt: r.created_at,
});
