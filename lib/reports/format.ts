/** Numbers as the reports print them: fixed locale, so the server render and the browser agree. */
import { formatCount, type UnitSystem } from '@/lib/units';
import { kgToLb } from '@/lib/viticulture';

const LOCALE = 'en-US';

export function formatNumber(value: number, digits = 1): string {
  return new Intl.NumberFormat(LOCALE, { maximumFractionDigits: digits, minimumFractionDigits: 0 }).format(value);
}

/** A proportion 0–1 as "12.3%". */
export function formatShare(value: number, digits = 1): string {
  return `${formatNumber(value * 100, digits)}%`;
}

/** A percentage 0–100 as "12.3%". */
export function formatPercent(value: number, digits = 1): string {
  return `${formatNumber(value, digits)}%`;
}

export function formatInterval(interval: { estimate: number; lower: number; upper: number }): string {
  return `${formatShare(interval.estimate)} (95% range ${formatShare(interval.lower)}–${formatShare(interval.upper)})`;
}

/** A weight from kilograms: "12.4 kg" or "27.3 lb"; large ones in tonnes or short tons. */
export function formatWeightKg(kg: number, units: UnitSystem, digits = 1): string {
  if (units === 'metric') return kg >= 10_000 ? `${formatNumber(kg / 1000, 1)} t` : `${formatNumber(kg, digits)} kg`;
  const lb = kgToLb(kg);
  return lb >= 20_000 ? `${formatNumber(lb / 2000, 1)} short tons` : `${formatNumber(lb, digits)} lb`;
}

export const weightUnit = (units: UnitSystem) => (units === 'metric' ? 'kg' : 'lb');

export { formatCount };
