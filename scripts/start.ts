/**
 * `npm start`: the whole app with its demo data at http://localhost:3000. Installs PostgreSQL if
 * missing, starts it and the S3 and SMTP fakes on loopback, migrates, seeds the demo, builds if the
 * sources changed, serves. Ctrl-C stops everything it started.
 */
import knex from 'knex';
import { seedDemo, DEMO_PASSWORD, DEMO_USERS } from '../db/seeds/demo';
import { buildIfNeeded, startNext } from './lib/app';
import { migrate } from './lib/migrate';
import { PROFILES } from './lib/profile';
import { log } from './lib/services';
import { startStack } from './lib/stack';

async function main() {
  const started = Date.now();
  const profile = PROFILES.demo;
  const stack = await startStack(profile);
  let stopping = false;
  const stop = async (code = 0) => {
    if (stopping) return;
    stopping = true;
    log('Stopping…');
    await stack.stop();
    process.exit(code);
  };
  process.on('SIGINT', () => void stop());
  process.on('SIGTERM', () => void stop());
  try {
    const env = stack.env;
    const applied = await migrate(env.DATABASE_URL!);
    if (applied.length) log(`Migrations applied: ${applied.length}`);
    if (env.VINEWARD_DEMO === '1') {
      const db = knex({ client: 'pg', connection: env.DATABASE_URL });
      try {
        await seedDemo(db, { env });
      } finally {
        await db.destroy();
      }
    }
    buildIfNeeded(env);
    const next = await startNext(profile.appPort, env);
    next.once('exit', (code) => {
      if (!stopping) void stop(code ?? 1);
    });
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    console.log(`
  Vineward is running at ${env.NEXTAUTH_URL}   (ready in ${seconds} s)
${
  env.VINEWARD_DEMO === '1'
    ? `
  Demo accounts (password: ${DEMO_PASSWORD}):
${DEMO_USERS.map((u) => `    ${u.role.padEnd(8)} ${u.email}`).join('\n')}
`
    : ''
}${env.SMTP_INBOX_URL ? `  Mail sent by the app (sign-in links, invitations): ${env.SMTP_INBOX_URL}\n` : ''}
  Press Ctrl-C to stop.
`);
  } catch (err) {
    console.error(err instanceof Error ? err.message : err);
    await stop(1);
  }
}

void main();
