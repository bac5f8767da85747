import 'server-only';
import type { NextRequest } from 'next/server';
import { getEnv } from '@/lib/env';
import { AppError } from '@/lib/server/errors';

/**
 * What every request must pass before a handler sees it: cookie-authenticated changes come from
 * our own pages, bodies have the type the route reads, and no body is read past its limit.
 */

export const JSON_TYPE = 'application/json';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
export const isMutation = (req: Request) => !SAFE_METHODS.has(req.method.toUpperCase());

/** The media type without parameters, lower case: `application/json; charset=utf-8` → `application/json`. */
export function mediaType(req: Request) {
  const value = req.headers.get('content-type');
  return value ? value.split(';')[0]!.trim().toLowerCase() : undefined;
}

function firstHost(value: string | null) {
  return value?.split(',')[0]?.trim().toLowerCase() || undefined;
}

/**
 * A browser names the page that sent a request in `Origin` (on every POST, PUT, PATCH and DELETE)
 * and, in current browsers, says `Sec-Fetch-Site: cross-site` when it came from another site.
 * Our own origin is NEXTAUTH_URL's, or the host this request was addressed to (`X-Forwarded-Host`
 * from a proxy, else `Host`), as Next.js judges server actions. A foreign page cannot set either
 * header on a request it sends with the person's cookie. Requests without `Origin` (scripts, tests,
 * mail clients) are not from a browser page and pass; they carry no cookie a page could borrow.
 */
export function assertSameOrigin(req: Request) {
  const refuse = () => new AppError('cross-site', 'This change was sent from another site, so it was refused. Open Vineward itself and try again.');
  if (req.headers.get('sec-fetch-site')?.toLowerCase() === 'cross-site') throw refuse();
  const origin = req.headers.get('origin');
  if (origin === null) return;
  let url: URL;
  try {
    url = new URL(origin);
  } catch {
    throw refuse(); // "null" (sandboxed frames, privacy redirects) and anything unreadable
  }
  if (url.origin === new URL(getEnv().NEXTAUTH_URL).origin) return;
  const host = firstHost(req.headers.get('x-forwarded-host')) ?? firstHost(req.headers.get('host'));
  if (host && url.host.toLowerCase() === host) return;
  throw refuse();
}

/** Refuses a body whose declared type the route does not read (415), before anything reads it. */
export function assertContentType(req: Request, accepts: readonly string[], needsBody: boolean) {
  const type = mediaType(req);
  if (type === undefined ? !needsBody : accepts.includes(type)) return;
  throw new AppError(
    'unsupported-media-type',
    type === undefined
      ? `Send the body as ${accepts.join(' or ')}, with that Content-Type.`
      : `A body of type ${type} is not accepted here; send ${accepts.join(' or ')}.`,
  );
}

export const tooLargeError = (maxBytes: number) => new AppError('payload-too-large', `The request is larger than ${maxBytes} bytes.`);

/**
 * Reads the body with a byte counter and stops at the limit: a body that lies about its length,
 * or sends none and never ends, costs at most `maxBytes` of memory and is refused with 413.
 */
export async function readLimited(req: NextRequest, maxBytes: number, tooLarge: (bytes: number, exact: boolean) => AppError = () => tooLargeError(maxBytes)) {
  const declared = Number(req.headers.get('content-length') ?? 0);
  if (declared > maxBytes) throw tooLarge(declared, true);
  if (!req.body) return Buffer.alloc(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      discardRest(reader);
      throw tooLarge(total, false);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks, total);
}

// How long the rest of a refused body is read and thrown away before the connection is cut.
const LINGER_MS = 10_000;

/**
 * Nothing more of a refused body is kept. It is read and dropped for a while, as web servers do
 * on a lingering close, so that a client still uploading gets to read the 413 rather than a reset
 * connection; one that keeps sending past that loses the connection.
 */
function discardRest(reader: ReadableStreamDefaultReader<Uint8Array>) {
  const cut = setTimeout(() => void reader.cancel().catch(() => undefined), LINGER_MS);
  cut.unref?.();
  void (async () => {
    try {
      while (!(await reader.read()).done);
    } catch {
      // the client went away, or the cut above came first
    } finally {
      clearTimeout(cut);
    }
  })();
}

export async function readLimitedText(req: NextRequest, maxBytes: number, tooLarge?: (bytes: number, exact: boolean) => AppError) {
  return (await readLimited(req, maxBytes, tooLarge)).toString('utf8');
}
