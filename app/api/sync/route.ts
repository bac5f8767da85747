import type { SyncAnswer } from '@/lib/contracts/sync';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { syncObservations } from '@/lib/server/services/sync';
import { syncRequestSchema } from '@/lib/validation/observation';

// 500 records of a few hundred bytes each; the limit keeps one request from holding a connection long.
export const POST = memberRoute(
  { permission: 'record-observations', body: syncRequestSchema, maxBytes: 2_000_000, response: responds<SyncAnswer>() },
  async (member, { body }) => ({
    results: await syncObservations(member, body.observations),
  }),
);
