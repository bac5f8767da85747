/** Brings up, for one profile, every local service the app needs and gives back its environment. */
import type { ChildProcess } from 'node:child_process';
import path from 'node:path';
import { profileEnv, type Profile } from './profile';
import { log, startPostgres, startS3Fake, startSmtpFake, stopChild, stopChildren, stopPostgres } from './services';

export interface Stack {
  env: NodeJS.ProcessEnv;
  adminDatabaseUrl?: string;
  s3?: ChildProcess;
  smtp?: ChildProcess;
  /** The local PostgreSQL's data folder, for fault tests that restart it. */
  pgData?: string;
  restartSmtp: () => Promise<void>;
  stop: () => Promise<void>;
}

export async function startStack(p: Profile, opts: { fast?: boolean } = {}): Promise<Stack> {
  const { env, local } = profileEnv(p);
  let adminDatabaseUrl: string | undefined;
  let pgData: string | undefined;
  if (local.postgres) {
    log(`PostgreSQL on 127.0.0.1:${p.pgPort} (data in ${path.relative(process.cwd(), p.dir)}/postgres)`);
    const pg = await startPostgres({
      dir: path.join(p.dir, 'postgres'),
      port: p.pgPort,
      database: p.name === 'test' ? 'vineward_test' : 'vineward',
      user: 'vineward',
      password: 'vineward-local',
      fast: opts.fast,
    });
    env.DATABASE_URL = pg.url;
    adminDatabaseUrl = pg.url.replace(/\/[^/]+$/, '/postgres');
    pgData = path.join(p.dir, 'postgres', 'data');
  }
  let s3: ChildProcess | undefined;
  if (local.s3) {
    log(`S3 fake on 127.0.0.1:${p.s3Port}`);
    s3 = await startS3Fake({ port: p.s3Port, dir: path.join(p.dir, 's3'), bucket: env.S3_BUCKET!, origins: [env.NEXTAUTH_URL!] });
  }
  let smtp: ChildProcess | undefined;
  const smtpOptions = { smtpPort: p.smtpPort, httpPort: p.inboxPort };
  if (local.smtp) {
    log(`SMTP fake on 127.0.0.1:${p.smtpPort}, inbox at http://127.0.0.1:${p.inboxPort}`);
    smtp = await startSmtpFake(smtpOptions);
  }
  const stack: Stack = {
    env,
    adminDatabaseUrl,
    s3,
    smtp,
    pgData,
    async restartSmtp() {
      if (stack.smtp) await stopChild(stack.smtp);
      stack.smtp = await startSmtpFake(smtpOptions);
    },
    async stop() {
      await stopChildren();
      if (local.postgres) stopPostgres(path.join(p.dir, 'postgres'));
    },
  };
  return stack;
}
