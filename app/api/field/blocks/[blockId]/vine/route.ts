import { z } from 'zod';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getBlock } from '@/lib/server/queries/blocks';
import { listVineObservations } from '@/lib/server/queries/field';
import { blockIdParams } from '@/lib/validation/params';

const query = z.object({ row: z.coerce.number().int().min(1), position: z.coerce.number().int().min(1) });

export const GET = memberRoute({ params: blockIdParams, query }, async (member, { params, query: { row, position } }) => {
  const block = await getBlock(db(), member.organisationId, params.blockId);
  if (!block) throw new AppError('not-found', 'No such block in your organisation.');
  return { observations: await listVineObservations(db(), block.id, row, position) };
});
