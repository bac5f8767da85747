import Link from 'next/link';
import { Logo, Wordmark } from '@/components/layout/logo';
import { OrganisationSwitcher } from '@/components/layout/organisation-switcher';
import { PhoneMenu } from '@/components/layout/phone-menu';
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

/**
 * One line on a phone (mark, estate, the pages behind a menu, sign-out); on a wider screen the
 * pages are spelled out beside the wordmark as before.
 */
export function AppHeader({ role, name, organisationId, memberships }: Props) {
  const links = NAV.filter((n) => n.roles.includes(role));
  return (
    <header className="border-b-2 border-line bg-panel print:hidden">
      <div className="mx-auto flex max-w-6xl items-center gap-2 px-3 py-1 sm:flex-wrap sm:gap-x-4 sm:gap-y-2 sm:px-4 sm:py-2">
        {/* No prefetch: on a phone in the row it would spend the first seconds on a page not asked for. */}
        <Link href="/" prefetch={false} className="flex min-h-touch shrink-0 items-center no-underline" aria-label="Vineward home">
          <span className="sm:hidden">
            <Logo size={36} />
          </span>
          <span className="hidden sm:inline">
            <Wordmark />
          </span>
        </Link>
        <nav aria-label="Main" className="hidden gap-1 overflow-x-auto sm:flex">
          {links.map((n) => (
            <Link key={n.href} href={n.href} className="flex min-h-touch items-center rounded-lg px-3 font-bold no-underline hover:bg-rootstock-tint">
              {n.label}
            </Link>
          ))}
        </nav>
        <div className="flex min-w-0 flex-1 items-center justify-end gap-2 sm:ml-auto sm:flex-none">
          <div className="min-w-0 truncate">
            <OrganisationSwitcher current={organisationId} memberships={memberships} />
          </div>
          <span className="hidden text-sm text-bark-soft md:inline" data-testid="signed-in-as">
            {name} · {role}
          </span>
          <PhoneMenu links={links} />
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}
