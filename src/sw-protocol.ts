// Messages between the page and Beadbook's service worker. Both sides type-check against this file, so a
// message neither side knows cannot be sent by accident.

/** Page → worker. SKIP_WAITING is the shape workbox-window's messageSkipWaiting() sends. */
export type PageToWorker = { readonly type: 'SKIP_WAITING' } | { readonly type: 'GET_VERSION' };

/** Worker → page, on the MessagePort that came with GET_VERSION. */
export interface VersionReply {
  readonly type: 'VERSION';
  readonly version: string;
}

export function isPageToWorker(data: unknown): data is PageToWorker {
  if (typeof data !== 'object' || data === null) return false;
  const type = (data as { readonly type?: unknown }).type;
  return type === 'SKIP_WAITING' || type === 'GET_VERSION';
}

export function isVersionReply(data: unknown): data is VersionReply {
  if (typeof data !== 'object' || data === null) return false;
  const reply = data as { readonly type?: unknown; readonly version?: unknown };
  return reply.type === 'VERSION' && typeof reply.version === 'string';
}
