import 'server-only';
import { AppError } from '@/lib/server/errors';

/** Sign-in bodies are a few hundred bytes; anything much larger is not a sign-in. */
const MAX_BYTES = 16 * 1024;

/**
 * The body of a POST to next-auth, read exactly as next-auth 4 reads it
 * (next-auth/next/utils.js getBody): JSON when the content type mentions application/json,
 * else form fields when it mentions application/x-www-form-urlencoded (the last of repeated
 * fields wins, as with Object.fromEntries), else nothing. The limits count what next-auth will
 * act on, however the body is encoded. Reads a clone, so next-auth still gets the body.
 */
export async function nextAuthBody(req: Request): Promise<Record<string, unknown> | undefined> {
  if (req.method !== 'POST' || !req.body) return undefined;
  const type = req.headers.get('content-type') ?? '';
  const json = type.includes('application/json');
  if (!json && !type.includes('application/x-www-form-urlencoded')) return undefined;
  const text = await boundedText(req.clone());
  if (!json) return Object.fromEntries(new URLSearchParams(text));
  try {
    const value: unknown = JSON.parse(text);
    return value && typeof value === 'object' ? (value as Record<string, unknown>) : undefined;
  } catch {
    // next-auth would throw on it and answer 500.
    throw new AppError('bad-request', 'The sign-in request is not valid JSON.');
  }
}

async function boundedText(req: Request) {
  const reader = req.body!.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > MAX_BYTES) {
      await reader.cancel();
      throw new AppError('payload-too-large', 'The sign-in request is too large.');
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString('utf8');
}
