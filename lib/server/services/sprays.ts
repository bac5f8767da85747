import 'server-only';
import type { z } from 'zod';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getBlock } from '@/lib/server/queries/blocks';
import { insertSpray, listSprays } from '@/lib/server/queries/sprays';
import type { spraySchema } from '@/lib/validation/spray';

export const listBlockSprays = (member: Member, blockId?: string) => listSprays(db(), member.organisationId, { blockId });

/** Records an application on one of the organisation's blocks; answers its id. */
export async function recordSpray(member: Member, input: z.infer<typeof spraySchema>) {
  const block = await getBlock(db(), member.organisationId, input.blockId);
  if (!block) throw new AppError('not-found', 'No such block in your organisation.', { blockId: ['No such block'] });
  return insertSpray(db(), { ...input, organisationId: member.organisationId, recordedBy: member.userId });
}
