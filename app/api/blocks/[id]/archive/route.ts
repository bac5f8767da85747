import { memberRoute } from '@/lib/server/http';
import { setArchived } from '@/lib/server/services/blocks';

// Archived blocks leave the lists and the field app but keep their history; restore brings them back.
export const POST = memberRoute({ permission: 'manage-organisation' }, async (member, { params }) => ({
  block: await setArchived(member, String(params.id), true),
}));
