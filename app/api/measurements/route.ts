import { NextResponse } from 'next/server';
import { z } from 'zod';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getBlock } from '@/lib/server/queries/blocks';
import { listMeasurements } from '@/lib/server/queries/measurements';
import { seasonBounds } from '@/lib/reports/season';
import { recordMeasurement } from '@/lib/server/services/reports';
import { measurementSchema } from '@/lib/validation/measurement';
import { searchToOptionsRaw } from '@/lib/validation/report';

const listQuery = z.strictObject({
  blockId: z.uuid('Must be the id of a block'),
  season: z.coerce.number('Must be a year').int('Must be a year').min(1900).max(2200),
});

/** GET /api/measurements?blockId=&season= — a block's yields and pruning weights of one season. */
export const GET = memberRoute({}, async (member, { req }) => {
  const query = listQuery.parse(searchToOptionsRaw(req.nextUrl.searchParams));
  const block = await getBlock(db(), member.organisationId, query.blockId);
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
  return { measurements: await listMeasurements(db(), member.organisationId, block.id, seasonBounds(query.season, member.seasonStartMonth)) };
});

/** POST /api/measurements — one vine's or one row sample's yield or pruning weight. */
export const POST = memberRoute({ permission: 'record-observations', body: measurementSchema }, async (member, { body }) =>
  NextResponse.json({ measurement: await recordMeasurement(member, body) }, { status: 201 }),
);
