'use server';

import { revalidatePath } from 'next/cache';
import { memberAction } from '@/lib/server/http';
import { createInvitation } from '@/lib/server/services/invitations';
import { invitationSchema } from '@/lib/validation/auth';

export const inviteMember = memberAction('manage-organisation', invitationSchema, async (member, input) => {
  const invitation = await createInvitation(member, input);
  revalidatePath('/team');
  return `Invitation sent to ${invitation.email}.`;
});
