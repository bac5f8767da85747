import { NextResponse } from 'next/server';
import { memberRoute } from '@/lib/server/http';
import { loadBlockReport } from '@/lib/server/services/reports';
import { parseReportOptions } from '@/lib/validation/report';

/**
 * GET /api/reports/blocks/:blockId?season=&compare=&budsPerVine=&budbreakPercent=&clustersPerShoot=
 * &clusterWeightG=&minutesPerVine=&hourlyCost=&grapeType=&budTarget= — the block's season report.
 */
export const GET = memberRoute({}, async (member, { params, req }) => {
  const body = await loadBlockReport(member, String(params.blockId), parseReportOptions(req.nextUrl.searchParams));
  return NextResponse.json(body, { headers: { 'Cache-Control': 'private, no-store' } });
});
