import { answersRaw } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { currentSeason, rowWorkCsv } from '@/lib/server/services/row-work';
import { rowWorkExportQuerySchema } from '@/lib/validation/row-work';

/** GET /api/reports/row-work.csv?season=2026[&blockId=] — every row-work record of the season. */
export const GET = memberRoute({ query: rowWorkExportQuerySchema, response: answersRaw }, async (member, { query }) => {
  const season = query.season ?? currentSeason(member);
  return new Response(await rowWorkCsv(member, season, query.blockId), {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="row-work-${season}.csv"`,
      'cache-control': 'private, no-store',
      'x-content-type-options': 'nosniff',
    },
  });
});
