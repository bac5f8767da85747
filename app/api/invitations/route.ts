import { NextResponse } from 'next/server';
import { responds } from '@/lib/contracts/http';
import type { InvitationCreated, InvitationList } from '@/lib/contracts/people';
import { memberRoute } from '@/lib/server/http';
import { createInvitation, listInvitations } from '@/lib/server/services/invitations';
import { invitationSchema } from '@/lib/validation/auth';

export const GET = memberRoute({ permission: 'manage-organisation', response: responds<InvitationList>() }, async (member) => ({
  invitations: await listInvitations(member),
}));

export const POST = memberRoute(
  { permission: 'manage-organisation', body: invitationSchema, response: responds<InvitationCreated>() },
  async (member, { body }) => NextResponse.json({ invitation: await createInvitation(member, body) }, { status: 201 }),
);
