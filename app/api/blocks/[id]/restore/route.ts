import { memberRoute } from '@/lib/server/http';
import { setArchived } from '@/lib/server/services/blocks';

export const POST = memberRoute({ permission: 'manage-organisation' }, async (member, { params }) => ({
  block: await setArchived(member, String(params.id), false),
}));
