import { NextResponse } from 'next/server';
import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { listSamplingPlans } from '@/lib/server/queries/sampling-plans';
import { createSamplingPlan } from '@/lib/server/services/sampling-plans';
import { blockQuery } from '@/lib/validation/params';
import { samplingPlanSchema } from '@/lib/validation/sampling-plan';

export const GET = memberRoute({ query: blockQuery }, async (member, { query }) => ({
  plans: await listSamplingPlans(db(), member.organisationId, query.blockId),
}));

export const POST = memberRoute({ permission: 'plan-sampling', body: samplingPlanSchema }, async (member, { body }) =>
  NextResponse.json({ plan: await createSamplingPlan(member, body) }, { status: 201 }),
);
