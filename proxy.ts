import { NextResponse, type NextRequest } from 'next/server';
import { FORWARDED_HEADERS, servedOverHttps } from '@/lib/client-address';

/**
 * Security headers on every response, and the request headers the app may believe. Authorisation
 * never happens here: every page, route handler and server action checks the session itself
 * (lib/server/auth/guard.ts). The CSP is built per request: it carries a fresh nonce that Next.js
 * reads from the request's own Content-Security-Policy header and puts on its inline scripts.
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
// RFC 6797; two years, the value browsers' preload lists ask for.
const HSTS = 'max-age=63072000; includeSubDomains';

function proxyHops() {
  const hops = Number(process.env.TRUSTED_PROXY_HOPS ?? 0);
  return Number.isInteger(hops) && hops > 0 ? hops : 0;
}

function contentSecurityPolicy(nonce: string) {
  const store = objectStoreOrigin();
  return [
    "default-src 'self'",
    // 'strict-dynamic' lets the scripts Next.js loads from its nonced bootstrap run; 'self' serves
    // browsers without it. 'unsafe-eval' only for the dev server's reloads.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ''}`,
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
}

export function proxy(req: NextRequest) {
  const hops = proxyHops();
  const https = servedOverHttps(process.env.NEXTAUTH_URL, req.headers, hops);
  const nonce = btoa(String.fromCharCode(...crypto.getRandomValues(new Uint8Array(16))));
  const csp = contentSecurityPolicy(nonce);

  const headers = new Headers(req.headers);
  // With no proxy in front, X-Forwarded-* came from the client: drop them, and Next.js writes its
  // own from the socket (lib/client-address.ts).
  if (hops === 0) for (const name of FORWARDED_HEADERS) headers.delete(name);
  headers.set('content-security-policy', csp);

  const res = NextResponse.next({ request: { headers } });
  res.headers.set('Content-Security-Policy', csp);
  if (https) res.headers.set('Strict-Transport-Security', HSTS);
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
