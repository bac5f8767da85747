import { NextResponse } from 'next/server';
import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { listOpenInvitations } from '@/lib/server/queries/invitations';
import { createInvitation } from '@/lib/server/services/invitations';
import { invitationSchema } from '@/lib/validation/auth';

export const GET = memberRoute({ permission: 'manage-organisation' }, async (member) => ({
  invitations: await listOpenInvitations(db(), member.organisationId),
}));

export const POST = memberRoute({ permission: 'manage-organisation', body: invitationSchema }, async (member, { body }) =>
  NextResponse.json({ invitation: await createInvitation(member, body) }, { status: 201 }),
);
