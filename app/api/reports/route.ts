import { memberRoute } from '@/lib/server/http';
import { loadEstateReport } from '@/lib/server/services/reports';
import { parseReportOptions } from '@/lib/validation/report';

/** GET /api/reports?season=2026&clustersPerShoot=&clusterWeightG=&hourlyCost=&grapeType= — every block's season side by side. */
export const GET = memberRoute({}, async (member, { req }) => loadEstateReport(member, parseReportOptions(req.nextUrl.searchParams)));
