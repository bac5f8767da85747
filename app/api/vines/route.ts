import { z } from 'zod';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { findVineByAddress } from '@/lib/server/queries/grid';
import { vinePanel } from './vine-panel';

const addressSchema = z.strictObject({
  block: z.uuid('Must be the id of a block'),
  row: z.coerce.number('Must be a row number').int('Must be a whole number').min(1, 'Rows start at 1').max(10000),
  position: z.coerce.number('Must be a vine number').int('Must be a whole number').min(1, 'Vines start at 1').max(10000),
});

/** GET /api/vines?block=&row=&position= — the same panel, found by the address the grid knows. */
export const GET = memberRoute({ query: addressSchema }, async (member, { query: address }) => {
  const vine = await findVineByAddress(db(), member.organisationId, address.block, address.row, address.position);
  if (!vine) throw new AppError('not-found', 'There is no vine at that address in your organisation.');
  return vinePanel(member, vine);
});
