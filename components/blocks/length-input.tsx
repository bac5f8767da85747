'use client';

import { useState } from 'react';
import { Input } from '@/components/ui/field';
import { formatLengthM, lengthExample, parseLength, type UnitSystem } from '@/lib/units';

interface Props {
  id: string;
  units: UnitSystem;
  /** Metres; NaN while the text cannot be read. */
  value: number | undefined;
  onChange: (metres: number) => void;
  onBlur?: () => void;
  invalid?: boolean;
}

/**
 * A spacing typed in the organisation's units ("8 ft", "7' 6\"", "2.4") and kept in metres. An
 * untouched field keeps the stored value exactly, so saving a form never drifts by rounding.
 */
export function LengthInput({ id, units, value, onChange, onBlur, invalid }: Props) {
  const [text, setText] = useState(() => (value !== undefined && Number.isFinite(value) ? formatLengthM(value, units) : ''));
  const other = units === 'metric' ? 'imperial' : 'metric';
  const readable = value !== undefined && Number.isFinite(value) && value > 0;
  return (
    <>
      <Input
        id={id}
        value={text}
        inputMode={units === 'metric' ? 'decimal' : 'text'}
        autoComplete="off"
        placeholder={lengthExample(units, 'm')}
        aria-invalid={invalid || undefined}
        aria-describedby={`${id}-reads`}
        onChange={(e) => {
          setText(e.target.value);
          onChange(parseLength(e.target.value, units, 'm') ?? NaN);
        }}
        onBlur={onBlur}
      />
      <p id={`${id}-reads`} className="text-sm text-bark-soft" aria-live="polite">
        {text.trim() === ''
          ? lengthExample(units, 'm')
          : readable
            ? `Reads as ${formatLengthM(value, units)} (${formatLengthM(value, other)})`
            : units === 'metric'
              ? 'Type metres, e.g. 2.4, or 2400 mm'
              : 'Type feet and inches, e.g. 8 ft or 7 ft 6 in'}
      </p>
    </>
  );
}
