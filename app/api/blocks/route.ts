import { NextResponse } from 'next/server';
import { memberRoute } from '@/lib/server/http';
import { createBlock, listBlockViews } from '@/lib/server/services/blocks';
import { blockSchema } from '@/lib/validation/block';

export const GET = memberRoute({}, async (member, { req }) => ({
  blocks: await listBlockViews(member, { archived: req.nextUrl.searchParams.get('archived') === '1' }),
}));

export const POST = memberRoute({ permission: 'manage-organisation', body: blockSchema }, async (member, { body }) =>
  NextResponse.json({ block: await createBlock(member, body) }, { status: 201 }),
);
