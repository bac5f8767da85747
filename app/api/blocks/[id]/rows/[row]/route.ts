import { memberRoute } from '@/lib/server/http';
import { numberParam, setRowVineCount } from '@/lib/server/services/blocks';
import { rowVineCountSchema } from '@/lib/validation/block';

export const PATCH = memberRoute({ permission: 'manage-organisation', body: rowVineCountSchema }, async (member, { params, body }) =>
  setRowVineCount(member, String(params.id), numberParam(params.row, 'row'), body.vineCount),
);
