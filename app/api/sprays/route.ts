import { NextResponse } from 'next/server';
import { responds } from '@/lib/contracts/http';
import type { SprayCreated, SprayList } from '@/lib/contracts/sprays';
import { memberRoute } from '@/lib/server/http';
import { listBlockSprays, recordSpray } from '@/lib/server/services/sprays';
import { blockQuery } from '@/lib/validation/params';
import { spraySchema } from '@/lib/validation/spray';

export const GET = memberRoute({ query: blockQuery, response: responds<SprayList>() }, async (member, { query }) => ({
  sprays: await listBlockSprays(member, query.blockId),
}));

export const POST = memberRoute({ permission: 'manage-organisation', body: spraySchema, response: responds<SprayCreated>() }, async (member, { body }) =>
  NextResponse.json({ id: await recordSpray(member, body) }, { status: 201 }),
);
