// A tag the user chose to start a new seam with: held while the New seam form is filled in, linked once the
// seam is saved, and forgotten if the form is left.
import type { TagVia } from '../../store/api.js';

let pending: { readonly tag: string; readonly via: TagVia } | null = null;

export function setPendingTag(tag: string, via: TagVia): void {
  pending = { tag, via };
}

/** The pending tag, taken: a second form does not link it again. */
export function takePendingTag(): { readonly tag: string; readonly via: TagVia } | null {
  const taken = pending;
  pending = null;
  return taken;
}
