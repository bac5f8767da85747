import { NextResponse } from 'next/server';
import type { BlockList, BlockOne } from '@/lib/contracts/blocks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { createBlock, listBlockViews } from '@/lib/server/services/blocks';
import { blockSchema } from '@/lib/validation/block';

export const GET = memberRoute({ response: responds<BlockList>() }, async (member, { req }) => ({
  blocks: await listBlockViews(member, { archived: req.nextUrl.searchParams.get('archived') === '1' }),
}));

export const POST = memberRoute({ permission: 'manage-organisation', body: blockSchema, response: responds<BlockOne>() }, async (member, { body }) =>
  NextResponse.json({ block: await createBlock(member, body) }, { status: 201 }),
);
