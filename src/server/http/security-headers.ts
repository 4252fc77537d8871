// Headers on every response. The CSP allows only what the app uses: its own scripts, styles, workers and API,
// images from itself or data: URLs; no inline script, no framing, no plugins.
import type { MiddlewareHandler } from 'hono';

export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self'",
  "img-src 'self' data:",
  "font-src 'self'",
  "connect-src 'self'",
  "worker-src 'self'",
  "manifest-src 'self'",
  "media-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join('; ');

export function securityHeaders(tls: boolean): MiddlewareHandler {
  return async (c, next) => {
    await next();
    const h = c.res.headers;
    h.set('Content-Security-Policy', CONTENT_SECURITY_POLICY);
    h.set('X-Content-Type-Options', 'nosniff');
    h.set('X-Frame-Options', 'DENY');
    // same-origin, not no-referrer: under no-referrer a browser sends "Origin: null" with a form post, and the
    // same-origin check on the supervisor's forms would refuse it.
    h.set('Referrer-Policy', 'same-origin');
    h.set('Cross-Origin-Opener-Policy', 'same-origin');
    h.set('Cross-Origin-Resource-Policy', 'same-origin');
    // The camera is for the app's tag scanning on this origin only.
    h.set('Permissions-Policy', 'camera=(self), microphone=(), geolocation=()');
    if (tls) h.set('Strict-Transport-Security', 'max-age=31536000');
  };
}
