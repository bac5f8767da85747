'use client';

import { usePathname } from 'next/navigation';
import { cn } from '@/lib/cn';

/**
 * The field places at the thumb for scouts and pruners on a phone. Plain links: a full page load
 * is served by the service worker's copy when there is no signal.
 */
export function PlacesBar({ places }: { places: { href: string; label: string; icon: string }[] }) {
  const path = usePathname();
  return (
    <nav
      aria-label="Field places"
      data-sticky-bottom
      data-testid="places-bar"
      className="fixed inset-x-0 bottom-0 z-20 grid auto-cols-fr grid-flow-col border-t-2 border-bark bg-panel sm:hidden print:hidden"
    >
      {places.map((p) => (
        <a
          key={p.href}
          href={p.href}
          aria-current={path === p.href ? 'page' : undefined}
          className={cn(
            'flex h-16 flex-col items-center justify-center px-1 text-center text-sm font-extrabold leading-tight text-bark no-underline',
            path === p.href && 'bg-rootstock text-white',
          )}
        >
          <span aria-hidden className="text-lg leading-none">
            {p.icon}
          </span>
          {p.label}
        </a>
      ))}
    </nav>
  );
}
