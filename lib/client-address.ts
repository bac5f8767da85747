/**
 * The address a request came from, for counting failed sign-ins. Route handlers never see the
 * socket, only X-Forwarded-For. Its left-most entries are whatever the client wrote and cannot be
 * trusted; each proxy in front of the app appends the address it saw (nginx's
 * $proxy_add_x_forwarded_for does), so the entry `hops` from the right is the one the outermost
 * trusted proxy saw. Without a proxy Next sets the header to the socket's address when the client
 * sent none; a client that sends one itself can then choose its address, so run Vineward behind a
 * proxy in production (TRUSTED_PROXY_HOPS, .env.example).
 */
export function clientAddress(headers: Headers | Record<string, unknown> | undefined, hops = 1): string {
  const raw = headers instanceof Headers ? headers.get('x-forwarded-for') : headers?.['x-forwarded-for'];
  const values = Array.isArray(raw) ? raw.join(',') : raw;
  const entries = typeof values === 'string' ? values.split(',').map((e) => e.trim()).filter(Boolean) : [];
  return entries[Math.max(0, entries.length - Math.max(1, hops))] ?? 'unknown';
}
