// How the sync client reaches the server: a fetch-shaped function, so the sender runs the same against the real
// network in the page and against the server application in process in tests.

export type Transport = (path: string, init: RequestInit) => Promise<Response>;

/** fetch() against the server the device enrolled with. */
export const fetchTransport =
  (origin: string): Transport =>
  (path, init) =>
    fetch(new URL(path, origin), { ...init, credentials: 'omit', cache: 'no-store' });

/** The server's own words for a refusal ({error, message}), or the status line when it sent none. */
export async function refusalText(res: Response): Promise<{ code: string; text: string }> {
  let code = `http${res.status}`;
  let text = `the server answered ${res.status}`;
  try {
    const body = (await res.json()) as { error?: unknown; message?: unknown };
    if (typeof body.error === 'string') code = body.error;
    if (typeof body.message === 'string') text += `: ${body.message}`;
  } catch {
    // No JSON body (a proxy's error page, say): the status says enough.
  }
  return { code, text };
}

export const errorText = (error: unknown): string =>
  error instanceof Error ? error.message || error.name : String(error);
