import { formatNumber } from '@/lib/reports/format';

/** "3 Jul 2026" for a `YYYY-MM-DD` day. */
export const formatDay = (day: string | null) =>
  day === null ? '–' : new Date(`${day}T00:00:00Z`).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });

export const formatMoney = (value: number | null) => (value === null ? '–' : formatNumber(value, 2));
export const formatHours = (value: number | null) => (value === null ? '–' : `${formatNumber(value, 1)} h`);
export const formatPace = (value: number | null) => (value === null ? '–' : `${formatNumber(value, 1)} vines/h`);

/** Projected hours over the estimate by more than a tenth: the pass is running behind (the tenth is common practice, no source). */
export const overEstimate = (projectedHours: number | null, estimatedHours: number | null) =>
  projectedHours !== null && estimatedHours !== null && estimatedHours > 0 && projectedHours > estimatedHours * 1.1;
