/**
 * An observation's numbers as a person types them, in their organisation's units, and as the
 * record keeps them: always metric (millimetres, kilograms). Lengths are rounded to 0.01 mm and
 * weights to the gram on the way in, finer than any calliper or field scale reads; on the way out
 * to 0.001 in and 0.01 lb, so a record opened again shows what was typed.
 */
import { inToMm, kgToLb, lbToKg, mmToIn } from '@/lib/viticulture';
import type { UnitSystem } from './index';

/** Fields held in millimetres on the record and typed in inches on an imperial estate. */
export const LENGTH_FIELDS: readonly string[] = ['diameterMm', 'longestInternodeMm'];
/** Fields held in kilograms on the record and typed in pounds on an imperial estate. */
export const WEIGHT_FIELDS: readonly string[] = ['pruningWeightKg'];

export type FormValue = string | number | boolean | undefined;
export type FormValues = Record<string, FormValue>;

const round = (value: number, places: number) => {
  const f = 10 ** places;
  return Math.round(value * f) / f;
};

const blank = (raw: unknown) => raw === undefined || raw === '' || (typeof raw === 'number' && Number.isNaN(raw));

/** What the form holds (organisation units) → the record's data (metric); blanks are left out. */
export function formToRecord(values: FormValues, system: UnitSystem): Record<string, unknown> {
  const data: Record<string, unknown> = {};
  for (const [key, raw] of Object.entries(values)) {
    if (blank(raw)) continue;
    let value: unknown = raw;
    // A negative number is left as typed, for the record's schema to refuse with its own message.
    if (system === 'imperial' && typeof raw === 'number' && raw >= 0) {
      if (LENGTH_FIELDS.includes(key)) value = round(inToMm(raw), 2);
      else if (WEIGHT_FIELDS.includes(key)) value = round(lbToKg(raw), 3);
    }
    data[key] = value;
  }
  return data;
}

/** A record's data (metric) → what the form shows (organisation units). */
export function recordToForm(data: Record<string, unknown>, system: UnitSystem): FormValues {
  const values: FormValues = {};
  for (const [key, raw] of Object.entries(data)) {
    let value = raw as FormValue;
    if (system === 'imperial' && typeof raw === 'number' && raw >= 0) {
      if (LENGTH_FIELDS.includes(key)) value = round(mmToIn(raw), 3);
      else if (WEIGHT_FIELDS.includes(key)) value = round(kgToLb(raw), 2);
    }
    values[key] = value;
  }
  return values;
}
