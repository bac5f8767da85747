import { cva, type VariantProps } from 'class-variance-authority';
import Link from 'next/link';
import type { ComponentProps } from 'react';
import { cn } from '@/lib/cn';

// Targets are at least 48 px: usable with a gloved thumb.
export const buttonClass = cva(
  'inline-flex min-h-touch items-center justify-center gap-2 rounded-lg px-5 text-base font-bold transition-colors disabled:cursor-not-allowed disabled:opacity-60',
  {
    variants: {
      variant: {
        primary: 'bg-rootstock text-white hover:bg-rootstock-hover',
        secondary: 'border-2 border-rootstock bg-panel text-rootstock hover:bg-rootstock-tint',
        quiet: 'text-bark-soft underline hover:text-bark',
        danger: 'bg-alarm text-white hover:opacity-90',
      },
      size: { normal: '', large: 'min-h-16 px-6 text-lg' },
    },
    defaultVariants: { variant: 'primary', size: 'normal' },
  },
);

type Variants = VariantProps<typeof buttonClass>;

export function Button({ className, variant, size, ...props }: ComponentProps<'button'> & Variants) {
  return <button className={cn(buttonClass({ variant, size }), className)} {...props} />;
}

export function ButtonLink({ className, variant, size, ...props }: ComponentProps<typeof Link> & Variants) {
  return <Link className={cn(buttonClass({ variant, size }), 'no-underline', className)} {...props} />;
}
