import { NextResponse } from 'next/server';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getBlock } from '@/lib/server/queries/blocks';
import { insertSpray, listSprays } from '@/lib/server/queries/sprays';
import { blockQuery } from '@/lib/validation/params';
import { spraySchema } from '@/lib/validation/spray';

export const GET = memberRoute({ query: blockQuery }, async (member, { query }) => ({
  sprays: await listSprays(db(), member.organisationId, { blockId: query.blockId }),
}));

export const POST = memberRoute({ permission: 'manage-organisation', body: spraySchema }, async (member, { body }) => {
  const block = await getBlock(db(), member.organisationId, body.blockId);
  if (!block) throw new AppError('not-found', 'No such block in your organisation.', { blockId: ['No such block'] });
  const id = await insertSpray(db(), { ...body, organisationId: member.organisationId, recordedBy: member.userId });
  return NextResponse.json({ id }, { status: 201 });
});
