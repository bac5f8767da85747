'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import { useEffect, useRef } from 'react';

/**
 * On a phone the desk pages sit behind one button, so the header keeps to one line. A plain
 * <details>, so it opens before any script has run; it closes when a page is chosen.
 */
export function PhoneMenu({ links }: { links: { href: string; label: string }[] }) {
  const menu = useRef<HTMLDetailsElement>(null);
  const path = usePathname();
  useEffect(() => {
    if (menu.current) menu.current.open = false;
  }, [path]);
  return (
    <details ref={menu} className="relative sm:hidden" data-testid="phone-menu">
      <summary className="flex min-h-touch cursor-pointer list-none items-center rounded-lg border-2 border-rootstock px-3 font-bold text-rootstock [&::-webkit-details-marker]:hidden">
        Menu
      </summary>
      <nav aria-label="Pages" className="absolute right-0 top-full z-30 mt-1 flex w-60 flex-col rounded-lg border-2 border-bark bg-panel p-1 shadow-lg">
        {links.map((n) => (
          <Link
            key={n.href}
            href={n.href}
            aria-current={path === n.href ? 'page' : undefined}
            className="flex min-h-touch items-center rounded-lg px-3 text-lg font-bold no-underline hover:bg-rootstock-tint aria-[current=page]:bg-rootstock aria-[current=page]:text-white"
          >
            {n.label}
          </Link>
        ))}
      </nav>
    </details>
  );
}
