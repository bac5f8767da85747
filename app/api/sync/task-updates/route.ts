import type { SyncAnswer } from '@/lib/contracts/sync';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { syncTaskUpdates } from '@/lib/server/services/tasks';
import { syncTaskUpdatesSchema } from '@/lib/validation/task';

/** POST /api/sync/task-updates — `{ taskUpdates: [...] }`: vines of a task marked done on the phone, once-only by id. */
export const POST = memberRoute(
  { permission: 'complete-task', body: syncTaskUpdatesSchema, maxBytes: 2_000_000, response: responds<SyncAnswer>() },
  async (member, { body }) => ({
    results: await syncTaskUpdates(member, body.taskUpdates),
  }),
);
