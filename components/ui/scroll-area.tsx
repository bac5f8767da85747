import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

/**
 * A box that scrolls sideways on a phone. It takes the keyboard's focus, so arrow keys scroll
 * what a mouse or a finger would (WCAG 2.1.1; axe scrollable-region-focusable), and it is a named
 * region, so a screen reader says what the focus landed on.
 */
export function ScrollArea({ label, className, children }: { label: string; className?: string; children: ReactNode }) {
  return (
    <div role="region" aria-label={label} tabIndex={0} className={cn('overflow-x-auto', className)}>
      {children}
    </div>
  );
}
