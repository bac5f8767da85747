import { NextResponse, type NextRequest } from 'next/server';

/**
 * Security headers on every response. Authorisation never happens here: every page, route
 * handler and server action checks the session itself (lib/server/auth/guard.ts).
 * The CSP is built at run time because the object store's origin comes from the environment.
 */
function objectStoreOrigin() {
  const endpoint = process.env.S3_ENDPOINT;
  if (!endpoint) return 'https://*.amazonaws.com';
  try {
    return new URL(endpoint).origin;
  } catch {
    return '';
  }
}

const dev = process.env.NODE_ENV !== 'production';

export function proxy(_req: NextRequest) {
  const store = objectStoreOrigin();
  const csp = [
    "default-src 'self'",
    // Next.js inlines its bootstrap scripts; 'unsafe-eval' only for the dev server's reloads.
    `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ''}`,
    "style-src 'self' 'unsafe-inline'",
    `img-src 'self' data: blob: ${store}`,
    `connect-src 'self' ${store}`,
    "font-src 'self'",
    "worker-src 'self'",
    "manifest-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
  const res = NextResponse.next();
  res.headers.set('Content-Security-Policy', csp);
  res.headers.set('X-Frame-Options', 'DENY');
  res.headers.set('X-Content-Type-Options', 'nosniff');
  res.headers.set('Referrer-Policy', 'strict-origin-when-cross-origin');
  res.headers.set('Permissions-Policy', 'camera=(self), geolocation=(self), microphone=()');
  return res;
}

/**
 * Not on /api/ but for next-auth's /api/auth/: wherever a proxy runs, Next.js copies each request
 * body into memory (up to 10 MB) and waits for its end before the route sees it, which would undo
 * the byte limit route handlers read bodies with (lib/server/boundary.ts). API answers get their
 * headers from next.config.mjs instead. next-auth reads its whole body itself, so there the copy's
 * 10 MB cap is the bound that holds.
 */
export const config = { matcher: ['/((?!api/(?!auth/)).*)'] };
