import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

/** One Desk item: a heading with its count, big enough to read across a room, and what to do. */
export function DeskSection({
  id,
  title,
  count,
  unit,
  tone = 'plain',
  action,
  children,
}: {
  id: string;
  title: string;
  count?: number;
  unit?: string;
  tone?: 'plain' | 'alarm' | 'attention';
  action?: ReactNode;
  children: ReactNode;
}) {
  const border = { plain: 'border-line', alarm: 'border-alarm', attention: 'border-cut' }[tone];
  return (
    <section id={id} aria-labelledby={`${id}-heading`} data-testid={`desk-${id}`} className={cn('scroll-mt-4 rounded-2xl border-2 bg-panel p-4', border)}>
      <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
        <h2 id={`${id}-heading`} className="text-xl font-bold">
          {title}
        </h2>
        {count !== undefined && (
          <p className="text-lg">
            <span className={cn('text-3xl font-extrabold', tone === 'alarm' && count > 0 && 'text-alarm')}>{count}</span> {unit}
          </p>
        )}
      </div>
      <div className="mt-3">{children}</div>
      {action && <div className="mt-3">{action}</div>}
    </section>
  );
}

/** A bar for a share done; the figure beside it says the same in words. */
export function Meter({ done, of }: { done: number; of: number }) {
  const share = of > 0 ? Math.min(1, done / of) : 0;
  return (
    <div aria-hidden="true" className="mt-1 h-3 w-full overflow-hidden rounded-full border border-bark-faint bg-ground">
      <div className="h-full bg-rootstock" style={{ width: `${(share * 100).toFixed(1)}%` }} />
    </div>
  );
}

/** "2 Dec 2026, 08:14 UTC": the Desk's times, the same on every screen. */
export function formatMoment(iso: string) {
  return `${new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone: 'UTC' })} UTC`;
}
