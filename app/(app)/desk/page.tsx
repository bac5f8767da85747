import type { Metadata } from 'next';
import Link from 'next/link';
import { ROLES } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { listMembers } from '@/lib/server/queries/organisations';

export const metadata: Metadata = { title: 'Desk' };

export default async function DeskPage() {
  const member = await memberForPage();
  const members = await listMembers(db(), member.organisationId);
  return (
    <div className="flex flex-col gap-6">
      <section>
        <p className="text-bark-soft">{member.organisationName}</p>
        <h1 className="text-3xl font-extrabold">Desk</h1>
        <p className="mt-1">
          Signed in as {member.name ?? member.email}, <strong>{member.role}</strong>.
        </p>
      </section>
      <section aria-labelledby="team-heading" className="rounded-2xl border-2 border-line bg-panel p-4">
        <h2 id="team-heading" className="text-xl font-bold">
          Team
        </h2>
        <ul className="mt-2 grid grid-cols-2 gap-2 sm:grid-cols-4">
          {ROLES.map((role) => (
            <li key={role} className="rounded-lg bg-ground p-3">
              <span className="block text-2xl font-extrabold">{members.filter((m) => m.role === role).length}</span>
              <span className="capitalize">{role}s</span>
            </li>
          ))}
        </ul>
        {member.role === 'manager' && (
          <Link href="/team" className="mt-3 inline-block font-bold text-rootstock underline">
            Manage the team and invitations
          </Link>
        )}
      </section>
    </div>
  );
}
