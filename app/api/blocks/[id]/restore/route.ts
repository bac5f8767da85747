import type { BlockOne } from '@/lib/contracts/blocks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { idParams } from '@/lib/validation/params';
import { setArchived } from '@/lib/server/services/blocks';

export const POST = memberRoute(
  { permission: 'manage-organisation', params: idParams('a block'), response: responds<BlockOne>() },
  async (member, { params }) => ({
    block: await setArchived(member, params.id, false),
  }),
);
