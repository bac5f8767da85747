import { responds } from '@/lib/contracts/http';
import type { InvitationRevoked } from '@/lib/contracts/people';
import { memberRoute } from '@/lib/server/http';
import { revokeInvitation } from '@/lib/server/services/invitations';
import { idParams } from '@/lib/validation/params';

/** DELETE /api/invitations/:id — a manager revokes a pending invitation; its link then answers 410. */
export const DELETE = memberRoute(
  { permission: 'manage-organisation', params: idParams('an invitation'), response: responds<InvitationRevoked>() },
  async (member, { params }) => ({ invitation: await revokeInvitation(member, params.id) }),
);
