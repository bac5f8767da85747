/**
 * The environment for one local profile ("demo" for `npm start`, "test" for `npm test`): which
 * services to start and the variables the app gets. Variables already set win, and a service
 * whose variable is set from outside is not started.
 */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { root } from './services';

export interface Profile {
  name: 'demo' | 'test';
  dir: string;
  appPort: number;
  pgPort: number;
  s3Port: number;
  smtpPort: number;
  inboxPort: number;
}

// The demo seed's S3 client runs in the script's own process, and the SDK reads this from process.env.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

/**
 * VINEWARD_SLOT=N (1–9) gives a test run its own ports, data folder and build folder, so that
 * several people (or agents) can run `npm test` side by side in one checkout.
 */
export const slot = Math.max(0, Math.min(9, Number(process.env.VINEWARD_SLOT ?? 0) || 0));
export const distDir = slot ? `.next-slot-${slot}` : '.next';

export const PROFILES: Record<Profile['name'], Profile> = {
  demo: { name: 'demo', dir: path.join(root, '.data/demo'), appPort: 3000, pgPort: 54329, s3Port: 4569, smtpPort: 2525, inboxPort: 2526 },
  test: {
    name: 'test',
    dir: path.join(root, slot ? `.data/test-${slot}` : '.data/test'),
    appPort: 3100 + slot * 10,
    pgPort: 54339 + slot * 10,
    s3Port: 4579 + slot * 10,
    smtpPort: 2535 + slot * 10,
    inboxPort: 2536 + slot * 10,
  },
};

function secret(dir: string) {
  const file = path.join(dir, 'auth-secret');
  if (!existsSync(file)) {
    mkdirSync(dir, { recursive: true });
    writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 });
  }
  return readFileSync(file, 'utf8').trim();
}

export function profileEnv(p: Profile, outside: NodeJS.ProcessEnv = process.env) {
  const local = {
    postgres: !outside.DATABASE_URL,
    s3: !outside.S3_ENDPOINT && !outside.S3_BUCKET,
    smtp: !outside.SMTP_URL,
  };
  const env: NodeJS.ProcessEnv = {
    ...outside,
    NEXT_TELEMETRY_DISABLED: '1',
    NEXT_DIST_DIR: p.name === 'test' ? distDir : '.next',
    // The SDK is pinned to a release that supports Node 20 (see STACK.md); its notice about later releases is noise here.
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
    S3_ENDPOINT: outside.S3_ENDPOINT ?? (local.s3 ? `http://127.0.0.1:${p.s3Port}` : undefined),
    S3_REGION: outside.S3_REGION ?? 'local',
    S3_BUCKET: outside.S3_BUCKET ?? 'vineward',
    S3_ACCESS_KEY_ID: outside.S3_ACCESS_KEY_ID ?? 'S3RVER',
    S3_SECRET_ACCESS_KEY: outside.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
    S3_FORCE_PATH_STYLE: outside.S3_FORCE_PATH_STYLE ?? '1',
    SMTP_URL: outside.SMTP_URL ?? `smtp://127.0.0.1:${p.smtpPort}`,
    MAIL_FROM: outside.MAIL_FROM ?? 'Vineward <no-reply@example.com>',
    NEXTAUTH_URL: outside.NEXTAUTH_URL ?? `http://localhost:${p.appPort}`,
    NEXTAUTH_SECRET: outside.NEXTAUTH_SECRET ?? secret(p.dir),
    VINEWARD_DEMO: outside.VINEWARD_DEMO ?? '1',
    SMTP_INBOX_URL: local.smtp ? `http://127.0.0.1:${p.inboxPort}` : outside.SMTP_INBOX_URL,
  };
  return { env, local };
}
