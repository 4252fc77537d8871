import { useEffect, useState } from 'preact/hooks';

/** Screens by hash so a reload, the back button and an offline start all land on the same screen. */
export type Route =
  | { readonly name: 'seams' }
  | { readonly name: 'seamNew' }
  | { readonly name: 'seam'; readonly id: string }
  | { readonly name: 'seamEdit'; readonly id: string }
  | { readonly name: 'gauge'; readonly id: string }
  | { readonly name: 'import'; readonly id: string }
  | { readonly name: 'settings' }
  | { readonly name: 'outbox' }
  /** Scanning a tag; `seamId` is the seam the user came from (the "current seam"). */
  | { readonly name: 'tag'; readonly seamId?: string }
  /** Printable tag labels for the seams chosen (ids). */
  | { readonly name: 'tagSheet'; readonly seamIds: readonly string[] }
  | { readonly name: 'caution' };

export function parseRoute(hash: string): Route {
  const parts = hash.replace(/^#\/?/, '').split('/').map(decodeURIComponent);
  const [head, id, sub] = parts;
  if (head === 'seam' && id === 'new') return { name: 'seamNew' };
  if (head === 'seam' && id) {
    if (sub === 'edit') return { name: 'seamEdit', id };
    if (sub === 'gauge') return { name: 'gauge', id };
    if (sub === 'import') return { name: 'import', id };
    return { name: 'seam', id };
  }
  if (head === 'settings') return { name: 'settings' };
  if (head === 'outbox') return { name: 'outbox' };
  if (head === 'tag') return id ? { name: 'tag', seamId: id } : { name: 'tag' };
  if (head === 'tags' && id === 'print') {
    return { name: 'tagSheet', seamIds: (sub ?? '').split(',').filter(Boolean).map(decodeURIComponent) };
  }
  if (head === 'caution') return { name: 'caution' };
  return { name: 'seams' };
}

export function hrefOf(route: Route): string {
  switch (route.name) {
    case 'seams':
      return '#/seams';
    case 'seamNew':
      return '#/seam/new';
    case 'seam':
      return `#/seam/${encodeURIComponent(route.id)}`;
    case 'seamEdit':
      return `#/seam/${encodeURIComponent(route.id)}/edit`;
    case 'gauge':
      return `#/seam/${encodeURIComponent(route.id)}/gauge`;
    case 'import':
      return `#/seam/${encodeURIComponent(route.id)}/import`;
    case 'settings':
      return '#/settings';
    case 'outbox':
      return '#/outbox';
    case 'caution':
      return '#/caution';
    case 'tag':
      return route.seamId === undefined ? '#/tag' : `#/tag/${encodeURIComponent(route.seamId)}`;
    case 'tagSheet':
      // Each id encoded twice: once so a comma in an id survives the list, once for the hash segment.
      return `#/tags/print/${encodeURIComponent(route.seamIds.map(encodeURIComponent).join(','))}`;
  }
}

export function navigate(route: Route): void {
  location.hash = hrefOf(route);
}

export function useRoute(): Route {
  const [route, setRoute] = useState(() => parseRoute(location.hash));
  useEffect(() => {
    const onChange = () => setRoute(parseRoute(location.hash));
    addEventListener('hashchange', onChange);
    return () => removeEventListener('hashchange', onChange);
  }, []);
  return route;
}
