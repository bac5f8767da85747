import type { Metadata } from 'next';
import { AcceptInvitationForm } from '@/components/auth/accept-invitation-form';
import { Notice } from '@/components/ui/field';
import { AppError } from '@/lib/server/errors';
import { describeInvitation } from '@/lib/server/services/invitations';

export const metadata: Metadata = { title: 'Invitation' };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let invitation: Awaited<ReturnType<typeof describeInvitation>>;
  try {
    invitation = await describeInvitation(token);
  } catch (err) {
    if (!(err instanceof AppError)) throw err;
    return (
      <div className="flex flex-col gap-3">
        <h1 className="text-2xl font-extrabold">Invitation</h1>
        <Notice tone="error">{err.message}</Notice>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-extrabold">{`Join ${invitation.organisationName}`}</h1>
      <p>
        You are invited as <strong>{invitation.role}</strong> with the address <strong>{invitation.email}</strong>.
      </p>
      <AcceptInvitationForm token={token} email={invitation.email} hasAccount={invitation.hasAccount} />
    </div>
  );
}
