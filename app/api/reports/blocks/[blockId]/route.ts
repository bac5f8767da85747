import { NextResponse } from 'next/server';
import type { BlockReportResponse } from '@/lib/contracts/reports';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { loadBlockReport } from '@/lib/server/services/reports';
import { blockIdParams } from '@/lib/validation/params';
import { parseReportOptions } from '@/lib/validation/report';

/**
 * GET /api/reports/blocks/:blockId?season=&compare=&budsPerVine=&budbreakPercent=&clustersPerShoot=
 * &clusterWeightG=&minutesPerVine=&hourlyCost=&grapeType=&budTarget= — the block's season report.
 */
export const GET = memberRoute({ params: blockIdParams, response: responds<BlockReportResponse>() }, async (member, { params, req }) => {
  const body = await loadBlockReport(member, params.blockId, parseReportOptions(req.nextUrl.searchParams));
  return NextResponse.json(body, { headers: { 'Cache-Control': 'private, no-store' } });
});
