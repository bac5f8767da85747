import type { SyncAnswer } from '@/lib/contracts/sync';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { syncRowWork } from '@/lib/server/services/row-work';
import { syncRowWorkSchema } from '@/lib/validation/row-work';

/** POST /api/sync/row-work — `{ records: [...] }`, the contract of POST /api/sync: one result per record, in order. */
export const POST = memberRoute(
  { permission: 'record-row-work', body: syncRowWorkSchema, maxBytes: 2_000_000, response: responds<SyncAnswer>() },
  async (member, { body }) => ({
    results: await syncRowWork(member, body.records),
  }),
);
