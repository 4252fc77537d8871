import type { Context } from 'hono';
import { getConnInfo } from '@hono/node-server/conninfo';

/** The client's address: the socket's, or the proxy's X-Forwarded-For when told to trust it. */
export function clientAddress(c: Context, trustProxy: boolean): string {
  if (trustProxy) {
    const forwarded = c.req.header('x-forwarded-for')?.split(',')[0]?.trim();
    if (forwarded) return forwarded;
  }
  // In-process requests (tests, benchmarks) have no socket.
  const env = c.env as { incoming?: unknown } | undefined;
  if (!env?.incoming) return 'local';
  return getConnInfo(c).remote.address ?? 'unknown';
}
