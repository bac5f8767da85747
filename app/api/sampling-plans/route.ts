import { NextResponse } from 'next/server';
import { responds } from '@/lib/contracts/http';
import type { SamplingPlanCreated, SamplingPlanList } from '@/lib/contracts/plans';
import { memberRoute } from '@/lib/server/http';
import { createSamplingPlan, listPlans } from '@/lib/server/services/sampling-plans';
import { blockQuery } from '@/lib/validation/params';
import { samplingPlanSchema } from '@/lib/validation/sampling-plan';

export const GET = memberRoute({ query: blockQuery, response: responds<SamplingPlanList>() }, async (member, { query }) => ({
  plans: await listPlans(member, query.blockId),
}));

export const POST = memberRoute(
  { permission: 'plan-sampling', body: samplingPlanSchema, response: responds<SamplingPlanCreated>() },
  async (member, { body }) => NextResponse.json({ plan: await createSamplingPlan(member, body) }, { status: 201 }),
);
