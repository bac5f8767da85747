'use client';

import type { InputValue } from '@/lib/reports/estimates';
import { formatNumber } from '@/lib/reports/format';

interface EstimateInputProps {
  id: string;
  label: string;
  unit?: string;
  text: string;
  error?: string;
  input: InputValue;
  onChange: (text: string) => void;
}

/**
 * One editable estimate input. What was typed stays in the box even when it cannot be used; the
 * message says why, and an empty box means the default named under it.
 */
export function EstimateInput({ id, label, unit, text, error, input, onChange }: EstimateInputProps) {
  const usingDefault = text.trim() === '';
  return (
    <div className="flex flex-col gap-1 print:hidden">
      <label htmlFor={id} className="font-bold">
        {label}
        {unit && <span className="font-normal text-bark-soft"> ({unit})</span>}
      </label>
      <input
        id={id}
        inputMode="decimal"
        autoComplete="off"
        value={text}
        placeholder={input.defaultValue === null ? 'enter a value' : String(input.defaultValue)}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-source${error ? ` ${id}-error` : ''}`}
        className="min-h-touch w-full max-w-48 rounded-lg border-2 border-line bg-panel px-3 text-lg focus:border-rootstock aria-invalid:border-alarm"
      />
      <p id={`${id}-source`} className="text-sm text-bark-faint">
        {usingDefault || Number(text) === input.defaultValue
          ? `Default${input.defaultValue === null ? ': none' : ` ${formatNumber(input.defaultValue, 2)}`}: ${input.defaultSource}`
          : `Entered; the default is ${input.defaultValue === null ? 'none' : formatNumber(input.defaultValue, 2)} (${input.defaultSource})`}
      </p>
      {error && (
        <p id={`${id}-error`} role="alert" className="text-sm font-bold text-alarm">
          {error}
        </p>
      )}
    </div>
  );
}

/** The inputs as printed: the value used and where it came from, one line each. */
export function PrintedInput({ label, unit, value, source }: { label: string; unit?: string; value: number | null; source: string }) {
  return (
    <li className="hidden print:list-item">
      {label}: <strong>{value === null ? '–' : formatNumber(value, 2)}</strong>
      {unit ? ` ${unit}` : ''} — {source}
    </li>
  );
}
