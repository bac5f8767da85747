import type { BlockDetailView, BlockOne } from '@/lib/contracts/blocks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { getBlockDetail, updateBlock } from '@/lib/server/services/blocks';
import { blockPatchSchema } from '@/lib/validation/block';
import { idParams } from '@/lib/validation/params';

const params = idParams('a block');

export const GET = memberRoute({ params, response: responds<BlockDetailView>() }, async (member, { params }) => getBlockDetail(member, params.id));

export const PATCH = memberRoute(
  { permission: 'manage-organisation', body: blockPatchSchema, params, response: responds<BlockOne>() },
  async (member, { params, body }) => ({
    block: await updateBlock(member, params.id, body),
  }),
);
