import { responds } from '@/lib/contracts/http';
import type { Unsubscribed } from '@/lib/contracts/notifications';
import { JSON_TYPE, mediaType, readLimitedText } from '@/lib/server/boundary';
import { AppError } from '@/lib/server/errors';
import { publicRoute } from '@/lib/server/http';
import { unsubscribeDigest } from '@/lib/server/services/notification-settings';
import { unsubscribeSchema } from '@/lib/validation/notification';

/**
 * POST /api/notifications/unsubscribe — turns the daily digest off for the person the signed token
 * names, without signing in. The token comes in the body (the page) or the query (mail clients'
 * one-click unsubscribe, which posts `List-Unsubscribe=One-Click` as a form to the
 * List-Unsubscribe address, RFC 8058).
 */
const ACCEPTS = [JSON_TYPE, 'application/x-www-form-urlencoded', 'multipart/form-data'];
const MAX_BYTES = 4096;

export const POST = publicRoute({ accepts: ACCEPTS, response: responds<Unsubscribed>() }, async ({ req }) => {
  const text = await readLimitedText(req, MAX_BYTES);
  let fromBody: unknown;
  try {
    fromBody = mediaType(req) === JSON_TYPE && text.trim() ? (JSON.parse(text) as { token?: unknown } | null)?.token : undefined;
  } catch {
    throw new AppError('bad-request', 'The request body is not valid JSON.');
  }
  const { token } = unsubscribeSchema.parse({ token: fromBody ?? req.nextUrl.searchParams.get('token') ?? undefined });
  await unsubscribeDigest(token);
  return { digest: false } as const;
});
