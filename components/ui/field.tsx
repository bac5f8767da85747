import type { ComponentProps, ReactNode } from 'react';
import { cn } from '@/lib/cn';

export function Field({ label, error, hint, children, id }: { label: string; error?: string; hint?: ReactNode; children: ReactNode; id: string }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      {children}
      {hint && <p className="text-sm text-bark-faint">{hint}</p>}
      {error && (
        <p id={`${id}-error`} className="text-sm font-bold text-alarm" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

export function Input({ className, ...props }: ComponentProps<'input'>) {
  return <input className={cn('min-h-touch rounded-lg border-2 border-line bg-panel px-3 text-base focus:border-rootstock', className)} {...props} />;
}

export function Select({ className, ...props }: ComponentProps<'select'>) {
  return <select className={cn('min-h-touch rounded-lg border-2 border-line bg-panel px-3 text-base focus:border-rootstock', className)} {...props} />;
}

/** A labelled choice for a table's filter bar: an "any" entry first (when given), then the options. */
export function FilterSelect<T extends string>({
  id,
  label,
  value,
  onChange,
  any,
  options,
}: {
  id: string;
  label: string;
  value: T;
  onChange: (value: T) => void;
  any?: string;
  options: readonly (readonly [T, string])[];
}) {
  return (
    <Field id={id} label={label}>
      <Select id={id} value={value} onChange={(e) => onChange(e.target.value as T)}>
        {any !== undefined && <option value="">{any}</option>}
        {options.map(([v, text]) => (
          <option key={v} value={v}>
            {text}
          </option>
        ))}
      </Select>
    </Field>
  );
}

export function Notice({ tone = 'info', children, className }: { tone?: 'info' | 'warn' | 'error' | 'ok'; children: ReactNode; className?: string }) {
  const tones = {
    info: 'border-line bg-panel',
    ok: 'border-rootstock bg-rootstock-tint',
    warn: 'border-cut bg-cut-tint',
    error: 'border-alarm bg-alarm-tint',
  };
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={cn('rounded-lg border-2 p-3', tones[tone], className)}>
      {children}
    </div>
  );
}
