import { responds } from '@/lib/contracts/http';
import type { InvitationAccepted } from '@/lib/contracts/people';
import { publicRoute } from '@/lib/server/http';
import { acceptInvitation } from '@/lib/server/services/invitations';
import { acceptInvitationSchema } from '@/lib/validation/auth';

export const POST = publicRoute({ body: acceptInvitationSchema, response: responds<InvitationAccepted>() }, async ({ body }) => ({
  accepted: await acceptInvitation(body),
}));
