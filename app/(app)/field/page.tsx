import type { Metadata } from 'next';
import { ButtonLink } from '@/components/ui/button';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Field' };

export default async function FieldPage() {
  const member = await memberForPage();
  return (
    <div className="mx-auto flex max-w-md flex-col gap-4">
      <div>
        <p className="text-bark-soft">{member.organisationName}</p>
        <h1 className="text-3xl font-extrabold">Field</h1>
        <p className="mt-1">
          Hello {member.name ?? member.email} — <strong>{member.role}</strong>.
        </p>
      </div>
      <ButtonLink href="/safety" size="large" variant="secondary">
        Cautions before you go out
      </ButtonLink>
      <ButtonLink href="/desk" size="large" variant="secondary">
        Team and organisation
      </ButtonLink>
    </div>
  );
}
