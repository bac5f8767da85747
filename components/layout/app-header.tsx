import Link from 'next/link';
import { Wordmark } from '@/components/layout/logo';
import { OrganisationSwitcher } from '@/components/layout/organisation-switcher';
import { SignOutButton } from '@/components/layout/sign-out-button';
import type { Role } from '@/lib/roles';

interface Props {
  role: Role;
  name: string;
  organisationId: string;
  memberships: { organisationId: string; organisationName: string; role: Role }[];
}

const NAV: { href: string; label: string; roles: Role[] }[] = [
  { href: '/field', label: 'Field', roles: ['manager', 'scout', 'pruner'] },
  { href: '/desk', label: 'Desk', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/blocks', label: 'Blocks', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/grid', label: 'Grid', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/photos', label: 'Photos', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/field/tasks', label: 'My tasks', roles: ['pruner'] },
  { href: '/tasks', label: 'Tasks', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/flags', label: 'Flags', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/plans', label: 'Plans', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/sprays', label: 'Sprays', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/work', label: 'Work', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/reports', label: 'Reports', roles: ['manager', 'advisor', 'scout', 'pruner'] },
  { href: '/team', label: 'Team', roles: ['manager'] },
  { href: '/safety', label: 'Safety', roles: ['manager', 'scout', 'pruner', 'advisor'] },
];

export function AppHeader({ role, name, organisationId, memberships }: Props) {
  return (
    <header className="border-b-2 border-line bg-panel print:hidden">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-4 gap-y-2 px-4 py-2">
        <Link href="/" className="no-underline" aria-label="Vineward home">
          <Wordmark />
        </Link>
        <nav aria-label="Main" className="order-3 flex w-full gap-1 overflow-x-auto sm:order-none sm:w-auto">
          {NAV.filter((n) => n.roles.includes(role)).map((n) => (
            <Link key={n.href} href={n.href} className="flex min-h-touch items-center rounded-lg px-3 font-bold no-underline hover:bg-rootstock-tint">
              {n.label}
            </Link>
          ))}
        </nav>
        <div className="ml-auto flex items-center gap-2">
          <OrganisationSwitcher current={organisationId} memberships={memberships} />
          <span className="hidden text-sm text-bark-soft md:inline" data-testid="signed-in-as">
            {name} · {role}
          </span>
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}
