import { z } from 'zod';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getBlock } from '@/lib/server/queries/blocks';
import { listVineObservations } from '@/lib/server/queries/field';

const query = z.object({ row: z.coerce.number().int().min(1), position: z.coerce.number().int().min(1) });

export const GET = memberRoute({}, async (member, { params, req }) => {
  const block = await getBlock(db(), member.organisationId, String(params.blockId)).catch(() => undefined);
  if (!block) throw new AppError('not-found', 'No such block in your organisation.');
  const { row, position } = query.parse(Object.fromEntries(req.nextUrl.searchParams));
  return { observations: await listVineObservations(db(), block.id, row, position) };
});
