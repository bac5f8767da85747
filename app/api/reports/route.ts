import type { EstateReportResponse } from '@/lib/contracts/reports';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { loadEstateReport } from '@/lib/server/services/reports';
import { parseReportOptions } from '@/lib/validation/report';

/** GET /api/reports?season=2026&clustersPerShoot=&clusterWeightG=&hourlyCost=&grapeType= — every block's season side by side. */
export const GET = memberRoute({ response: responds<EstateReportResponse>() }, async (member, { req }) =>
  loadEstateReport(member, parseReportOptions(req.nextUrl.searchParams)),
);
