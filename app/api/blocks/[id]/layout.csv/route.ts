import { answersRaw } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { idParams } from '@/lib/validation/params';
import { exportLayout } from '@/lib/server/services/blocks';

/** The block's layout in the import format (see lib/validation/block.ts), so it round-trips. */
export const GET = memberRoute({ params: idParams('a block'), response: answersRaw }, async (member, { params }) => {
  const { name, csv } = await exportLayout(member, params.id);
  const file = `${
    name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'block'
  }-layout.csv`;
  return new Response(csv, {
    headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${file}"`, 'cache-control': 'no-store' },
  });
});
