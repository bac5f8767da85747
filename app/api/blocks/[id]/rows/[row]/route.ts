import type { RowVineCount } from '@/lib/contracts/blocks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { numberParam, setRowVineCount } from '@/lib/server/services/blocks';
import { rowVineCountSchema } from '@/lib/validation/block';
import { blockRowParams } from '@/lib/validation/params';

export const PATCH = memberRoute(
  { permission: 'manage-organisation', body: rowVineCountSchema, params: blockRowParams, response: responds<RowVineCount>() },
  async (member, { params, body }) => setRowVineCount(member, params.id, numberParam(params.row, 'row'), body.vineCount),
);
