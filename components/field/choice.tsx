'use client';

import { cn } from '@/lib/cn';

/** A row of big toggle buttons: one tap, no dropdown, readable in sun. */
export function Choice<T extends string | boolean>({
  label,
  value,
  options,
  onChange,
  error,
}: {
  label: string;
  value: T | undefined;
  options: { value: T; label: string }[];
  onChange: (value: T | undefined) => void;
  error?: string;
}) {
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="mb-1 font-bold">{label}</legend>
      <div className="flex flex-wrap gap-2">
        {options.map((o) => (
          <button
            key={String(o.value)}
            type="button"
            aria-pressed={value === o.value}
            onClick={() => onChange(value === o.value ? undefined : o.value)}
            className={cn(
              'min-h-touch min-w-touch flex-1 rounded-lg border-2 px-3 font-bold',
              value === o.value ? 'border-rootstock bg-rootstock text-white' : 'border-line bg-panel',
            )}
          >
            {o.label}
          </button>
        ))}
      </div>
      {error && (
        <p className="text-sm font-bold text-alarm" role="alert">
          {error}
        </p>
      )}
    </fieldset>
  );
}
