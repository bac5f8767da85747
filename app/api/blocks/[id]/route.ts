import { memberRoute } from '@/lib/server/http';
import { getBlockDetail, updateBlock } from '@/lib/server/services/blocks';
import { blockPatchSchema } from '@/lib/validation/block';

export const GET = memberRoute({}, async (member, { params }) => getBlockDetail(member, String(params.id)));

export const PATCH = memberRoute({ permission: 'manage-organisation', body: blockPatchSchema }, async (member, { params, body }) => ({
  block: await updateBlock(member, String(params.id), body),
}));
