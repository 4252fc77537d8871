// The tags that lead to a seam, as the server knows them: those in its set-up, then each link and unlink the
// tablets recorded, in the server's receive order (the tablets' own rule: a tag names one seam at a time).
import type { RecordBodies } from '../../protocol/index.js';
import type { SeamMaterial } from '../storage/types.js';
import { foldSeam } from '../grading/fold.js';

export function seamTags(material: SeamMaterial): string[] {
  const tags = new Set(foldSeam(material).seam?.tags ?? []);
  for (const r of material.records) {
    if (r.kind !== 'tagLink') continue;
    const body = JSON.parse(r.body) as RecordBodies['tagLink'];
    if (body.action === 'link') tags.add(body.tag);
    else tags.delete(body.tag);
  }
  return [...tags];
}
