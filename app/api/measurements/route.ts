import { NextResponse } from 'next/server';
import { responds } from '@/lib/contracts/http';
import type { MeasurementList, MeasurementOne } from '@/lib/contracts/reports';
import { memberRoute } from '@/lib/server/http';
import { listBlockMeasurements, recordMeasurement } from '@/lib/server/services/reports';
import { measurementListQuerySchema, measurementSchema } from '@/lib/validation/measurement';
import { searchToOptionsRaw } from '@/lib/validation/report';

/** GET /api/measurements?blockId=&season= — a block's yields and pruning weights of one season. */
export const GET = memberRoute({ response: responds<MeasurementList>() }, async (member, { req }) => ({
  measurements: await listBlockMeasurements(member, measurementListQuerySchema.parse(searchToOptionsRaw(req.nextUrl.searchParams))),
}));

/** POST /api/measurements — one vine's or one row sample's yield or pruning weight. */
export const POST = memberRoute(
  { permission: 'record-observations', body: measurementSchema, response: responds<MeasurementOne>() },
  async (member, { body }) => NextResponse.json({ measurement: await recordMeasurement(member, body) }, { status: 201 }),
);
