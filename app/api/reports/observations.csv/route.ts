import { answersRaw } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { exportObservations } from '@/lib/server/services/reports';
import { exportQuerySchema, searchToOptionsRaw } from '@/lib/validation/report';

/** GET /api/reports/observations.csv?season=2026[&blockId=] — the season's observations, streamed (columns in lib/reports/csv.ts). */
export const GET = memberRoute({ response: answersRaw }, async (member, { req }) => {
  const query = exportQuerySchema.parse(searchToOptionsRaw(req.nextUrl.searchParams));
  const { filename, stream } = await exportObservations(member, query.season, query.blockId);
  return new Response(stream, {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${filename}"`,
      'cache-control': 'private, no-store',
      'x-content-type-options': 'nosniff',
    },
  });
});
