import { NextResponse } from 'next/server';
import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { listSamplingPlans } from '@/lib/server/queries/sampling-plans';
import { createSamplingPlan } from '@/lib/server/services/sampling-plans';
import { samplingPlanSchema } from '@/lib/validation/sampling-plan';

export const GET = memberRoute({}, async (member, { req }) => ({
  plans: await listSamplingPlans(db(), member.organisationId, req.nextUrl.searchParams.get('blockId') ?? undefined),
}));

export const POST = memberRoute({ permission: 'plan-sampling', body: samplingPlanSchema }, async (member, { body }) =>
  NextResponse.json({ plan: await createSamplingPlan(member, body) }, { status: 201 }),
);
