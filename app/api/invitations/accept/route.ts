import { publicRoute } from '@/lib/server/http';
import { acceptInvitation } from '@/lib/server/services/invitations';
import { acceptInvitationSchema } from '@/lib/validation/auth';

export const POST = publicRoute({ body: acceptInvitationSchema }, async ({ body }) => ({
  accepted: await acceptInvitation(body),
}));
