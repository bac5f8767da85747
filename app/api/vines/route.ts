import { z } from 'zod';
import type { VinePanelResponse } from '@/lib/contracts/grid';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { vinePanelAt } from '@/lib/server/services/grid';

const addressSchema = z.strictObject({
  block: z.uuid('Must be the id of a block'),
  row: z.coerce.number('Must be a row number').int('Must be a whole number').min(1, 'Rows start at 1').max(10000),
  position: z.coerce.number('Must be a vine number').int('Must be a whole number').min(1, 'Vines start at 1').max(10000),
});

/** GET /api/vines?block=&row=&position= — the same panel, found by the address the grid knows. */
export const GET = memberRoute({ query: addressSchema, response: responds<VinePanelResponse>() }, async (member, { query }) => vinePanelAt(member, query));
