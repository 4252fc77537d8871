import { useEffect, useState } from 'preact/hooks';
import { shownTag } from '../../domain/tags/tag-text.js';
import type { TagLinkRecord } from '../../store/api.js';
import { hrefOf } from '../router.js';
import { getStore } from '../services/store.js';

/** The tags linked to a seam (as text), each with Unlink; scanning from here links a new one to this seam. */
export function LinkedTags({ seamId }: { readonly seamId: string }) {
  const [links, setLinks] = useState<TagLinkRecord[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const load = () =>
    getStore()
      .then((s) => s.seamTags(seamId))
      .then(setLinks, (e: unknown) => setError(e instanceof Error ? e.message : String(e)));
  useEffect(() => {
    void load();
  }, [seamId]);

  const unlink = async (tag: string) => {
    setError(null);
    try {
      await (await getStore()).unlinkTag(seamId, tag);
      await load();
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };

  return (
    <div class="linked-tags">
      <p class="seam-meta">Linked tags: {links === null ? '…' : links.length === 0 ? 'none' : null}</p>
      {links?.length ? (
        <ul class="linked-tag-list">
          {links.map((l) => (
            <li key={l.key}>
              <code class="tag-text" title={l.tag}>
                {shownTag(l.tag)}
              </code>{' '}
              <button
                type="button"
                onClick={() => void unlink(l.tag)}
                aria-label={`Unlink tag ${shownTag(l.tag)}`}
              >
                Unlink
              </button>
            </li>
          ))}
        </ul>
      ) : null}
      <div class="actions">
        <a class="button" href={hrefOf({ name: 'tag', seamId })}>
          Scan a tag for this seam
        </a>
        <a class="button" href={hrefOf({ name: 'tagSheet', seamIds: [seamId] })}>
          Print a tag label
        </a>
      </div>
      {error ? (
        <p role="alert" class="banner banner-bad">
          ⚠ {error}
        </p>
      ) : null}
    </div>
  );
}
