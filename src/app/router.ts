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
