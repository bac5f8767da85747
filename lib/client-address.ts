/**
 * The address a request came from, for counting sign-in attempts. Route handlers never see the
 * socket, only X-Forwarded-For, and Next.js writes the socket's address there only when the
 * request has none (`??=` in next/dist/server/base-server.js), so a client can write any value.
 *
 * - `hops = 0` (the default: nothing in front of the app): proxy.ts deletes every client-written
 *   X-Forwarded-* header before routing, so the value the handler sees is the one Next.js wrote
 *   from the socket.
 * - `hops = N` (N proxies in front, each appending the address it saw, as nginx's
 *   $proxy_add_x_forwarded_for does): the entry N from the right is the one the outermost trusted
 *   proxy saw; the entries to its left are whatever the client wrote.
 *
 * Either way the last usable entry is never one the client chose (TRUSTED_PROXY_HOPS, .env.example).
 */
export function clientAddress(headers: Headers | Record<string, unknown> | undefined, hops = 0): string {
  const raw = headers instanceof Headers ? headers.get('x-forwarded-for') : headers?.['x-forwarded-for'];
  const values = Array.isArray(raw) ? raw.join(',') : raw;
  const entries =
    typeof values === 'string'
      ? values
          .split(',')
          .map((e) => e.trim())
          .filter(Boolean)
      : [];
  return entries[Math.max(0, entries.length - Math.max(1, hops))] ?? 'unknown';
}

/** Headers a proxy in front of the app writes; without a configured proxy they came from the client. */
export const FORWARDED_HEADERS = ['x-forwarded-for', 'x-forwarded-host', 'x-forwarded-proto', 'x-forwarded-port', 'x-real-ip', 'forwarded'];

/** Whether the person's connection was https, as the site's own URL or a trusted proxy tells. */
export function servedOverHttps(siteUrl: string | undefined, headers: Headers, hops: number): boolean {
  if (siteUrl?.startsWith('https://')) return true;
  if (hops < 1) return false;
  const proto = (headers.get('x-forwarded-proto') ?? '')
    .split(',')
    .map((e) => e.trim().toLowerCase())
    .filter(Boolean);
  return proto[Math.max(0, proto.length - hops)] === 'https';
}
