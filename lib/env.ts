/**
 * Every connection Vineward makes comes from these variables, checked once at start-up so a
 * wrong deployment fails with a message naming each bad variable (see .env.example).
 */
import { z } from 'zod';

const flag = z
  .enum(['0', '1', 'true', 'false'])
  .optional()
  .transform((v) => v === '1' || v === 'true');

/** A duration or count with a default, as a positive whole number. */
const whole = (fallback: number, max = 86_400_000) =>
  z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').max(max, `must be ${max} or fewer`).default(fallback);

const schema = z.object({
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'must be a postgres:// connection URL'),
  S3_ENDPOINT: z.url('must be the URL of an S3-compatible endpoint').optional(),
  S3_REGION: z.string().min(1, 'must name a region (any value for the local fake)'),
  S3_BUCKET: z.string().min(3, 'must name the bucket'),
  S3_ACCESS_KEY_ID: z.string().min(1, 'is required'),
  S3_SECRET_ACCESS_KEY: z.string().min(1, 'is required'),
  S3_FORCE_PATH_STYLE: flag,
  SMTP_URL: z.string().regex(/^smtps?:\/\//, 'must be an smtp:// or smtps:// URL'),
  MAIL_FROM: z.string().min(3).default('Vineward <no-reply@example.com>'),
  INVITATIONS_PER_DAY: z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').max(1000, 'must be 1000 or fewer').default(20),
  NEXTAUTH_SECRET: z.string().min(32, 'must be at least 32 characters of random text'),
  NEXTAUTH_URL: z.url('must be the public URL of the app, e.g. http://localhost:3000'),
  VINEWARD_DEMO: flag,
  // Deadlines on every outside call (milliseconds). A slow or stalled service makes only the routes
  // that need it answer 503, instead of piling up requests that hold connections (see DEVELOPERS.md).
  DATABASE_POOL_MAX: whole(10, 200),
  // Cost 12 is about 250 ms here: slow for guessing, fine for a person signing in. Tests lower it.
  BCRYPT_COST: z.coerce.number().int('must be a whole number').min(4, 'must be 4 or more').max(16, 'must be 16 or fewer').default(12),
  // The mail worker: how often it looks for queued mail, how often it adds notices and digests,
  // and the hour (UTC) the daily digest goes out.
  MAIL_POLL_MS: whole(2000, 3_600_000),
  MAIL_SCHEDULE_MS: whole(60_000),
  DIGEST_HOUR_UTC: z.coerce.number().int('must be a whole number').min(0, 'must be 0 to 23').max(23, 'must be 0 to 23').default(6),
  DATABASE_ACQUIRE_TIMEOUT_MS: whole(5000),
  DATABASE_CONNECT_TIMEOUT_MS: whole(5000),
  DATABASE_STATEMENT_TIMEOUT_MS: whole(15_000),
  DATABASE_IDLE_IN_TRANSACTION_TIMEOUT_MS: whole(15_000),
  S3_CONNECT_TIMEOUT_MS: whole(2000),
  S3_REQUEST_TIMEOUT_MS: whole(3000),
  S3_CALL_TIMEOUT_MS: whole(20_000),
  SMTP_CONNECTION_TIMEOUT_MS: whole(5000),
  SMTP_GREETING_TIMEOUT_MS: whole(5000),
  SMTP_SOCKET_TIMEOUT_MS: whole(15_000),
  // Photos: the most pixels a decoded upload may have (sharp's own default is 268 million), how
  // many images one server decodes at once, and how long a presigned upload link lives (seconds).
  PHOTO_MAX_PIXELS: whole(40_000_000, 268_000_000),
  IMAGE_CONCURRENCY: whole(2, 32),
  PHOTO_UPLOAD_LINK_SECONDS: whole(120, 3600),
  // Where the build is (npm test builds each slot into its own folder); the worker is served from it.
  NEXT_DIST_DIR: z.string().min(1).default('.next'),
  // 0: nothing in front of the app, so no X-Forwarded-* header is believed (lib/client-address.ts).
  TRUSTED_PROXY_HOPS: z.coerce.number().int('must be a whole number').min(0, 'must be 0 (no proxy) or more').max(10, 'must be 10 or fewer').default(0),
});

export type Env = z.infer<typeof schema>;

let cached: Env | undefined;

export function describeEnvProblems(error: z.ZodError) {
  return error.issues.map((i) => `  - ${i.path.join('.') || '(env)'}: ${i.message}`).join('\n');
}

/**
 * One setting, checked by the same rule as at start-up, for code that runs without the whole
 * environment (the migration CLI, seeds, module constants read at import).
 */
export function envSetting<K extends keyof Env>(key: K, source: Record<string, string | undefined> = process.env): Env[K] {
  const parsed = schema.shape[key].safeParse(source[key]);
  if (!parsed.success) throw new Error(`Vineward cannot start: ${key}: ${parsed.error.issues.map((i) => i.message).join('; ')}`);
  return parsed.data as Env[K];
}

export function getEnv(source: Record<string, string | undefined> = process.env): Env {
  if (cached && source === process.env) return cached;
  const parsed = schema.safeParse(source);
  if (!parsed.success) {
    throw new Error(
      `Vineward cannot start: some environment variables are missing or malformed:\n${describeEnvProblems(parsed.error)}\n` +
        'See .env.example for what each one means.',
    );
  }
  if (source === process.env) cached = parsed.data;
  return parsed.data;
}
