import type { Metadata } from 'next';
import { inviteMember } from '@/app/(app)/team/actions';
import { InviteForm } from '@/components/layout/invite-form';
import { OpenInvitations } from '@/components/layout/open-invitations';
import { UndeliveredMail } from '@/components/layout/undelivered-mail';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { listOpenInvitations } from '@/lib/server/queries/invitations';
import { listUndeliveredMail } from '@/lib/server/queries/mail-outbox';
import { listMembers } from '@/lib/server/queries/organisations';

export const metadata: Metadata = { title: 'Team' };

export default async function TeamPage() {
  const member = await memberForPage('manage-organisation');
  const [members, invitations, undelivered] = await Promise.all([
    listMembers(db(), member.organisationId),
    listOpenInvitations(db(), member.organisationId),
    listUndeliveredMail(db(), member.organisationId),
  ]);
  return (
    <div className="flex flex-col gap-6">
      <h1 className="text-3xl font-extrabold">Team of {member.organisationName}</h1>
      <section className="rounded-2xl border-2 border-line bg-panel p-4">
        <h2 className="mb-3 text-xl font-bold">Invite someone</h2>
        <InviteForm invite={inviteMember} />
      </section>
      <section>
        <h2 className="mb-2 text-xl font-bold">Members</h2>
        <table className="w-full border-collapse text-left">
          <thead>
            <tr className="border-b-2 border-line">
              <th className="py-2">Name</th>
              <th>E-mail</th>
              <th>Role</th>
            </tr>
          </thead>
          <tbody>
            {members.map((m) => (
              <tr key={m.userId} className="border-b border-line">
                <td className="py-2">{m.name ?? '—'}</td>
                <td className="break-all">{m.email}</td>
                <td className="capitalize">{m.role}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      {invitations.length > 0 && (
        <section>
          <h2 className="mb-2 text-xl font-bold">Open invitations</h2>
          <OpenInvitations items={invitations.map((i) => ({ id: i.id, email: i.email, role: i.role, expiresOn: i.expires_at.toISOString().slice(0, 10) }))} />
        </section>
      )}
      {undelivered.length > 0 && (
        <section>
          <h2 className="mb-2 text-xl font-bold">Mail that may not have arrived</h2>
          <UndeliveredMail items={undelivered.map((m) => ({ ...m, createdAt: m.createdAt.toISOString() }))} />
        </section>
      )}
    </div>
  );
}
