import { getEnv } from './lib/env';

// Fail at start-up, naming each bad variable, rather than at the first request that needs one.
try {
  getEnv();
} catch (err) {
  console.error((err as Error).message);
  process.exit(1);
}

// Background chores of every app server. Each is safe to run on several servers at once (rows are
// claimed with SKIP LOCKED), so nothing assumes a single process.
const HOUR = 60 * 60 * 1000;
setInterval(() => {
  void import('./lib/server/services/photos')
    .then(({ sweepPendingPhotos }) => sweepPendingPhotos())
    .catch((err) => console.error('Sweeping unconfirmed photo uploads failed:', err));
}, HOUR).unref();

// Notification mail: the outbox worker, with its overdue and digest schedule. Not during `next build`.
if (process.env.NEXT_PHASE !== 'phase-production-build') {
  void import('./lib/server/services/mail-worker')
    .then(({ startMailWorker }) => startMailWorker())
    .catch((err) => console.error('The mail worker did not start:', err));
}
