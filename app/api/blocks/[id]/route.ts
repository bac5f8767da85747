import { memberRoute } from '@/lib/server/http';
import { getBlockDetail, updateBlock } from '@/lib/server/services/blocks';
import { blockPatchSchema } from '@/lib/validation/block';
import { idParams } from '@/lib/validation/params';

const params = idParams('a block');

export const GET = memberRoute({ params }, async (member, { params }) => getBlockDetail(member, params.id));

export const PATCH = memberRoute({ permission: 'manage-organisation', body: blockPatchSchema, params }, async (member, { params, body }) => ({
  block: await updateBlock(member, params.id, body),
}));
