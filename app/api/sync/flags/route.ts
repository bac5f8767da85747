import type { SyncAnswer } from '@/lib/contracts/sync';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { syncFlags } from '@/lib/server/services/flags';
import { syncFlagsSchema } from '@/lib/validation/flag';

/** POST /api/sync/flags — `{ flags: [...] }`, the contract of POST /api/sync: one result per record, in order. */
export const POST = memberRoute(
  { permission: 'flag-vine', body: syncFlagsSchema, maxBytes: 2_000_000, response: responds<SyncAnswer>() },
  async (member, { body }) => ({
    results: await syncFlags(member, body.flags),
  }),
);
