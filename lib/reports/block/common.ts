/** What every section of the block report shares: the figure shape, record lookups and small sums. */
import { BALANCED_PRUNING_FORMULAS, type BalancedPruningFormula, type GrapeType, type ProportionInterval, type ViticultureSettings } from '@/lib/viticulture';
import type { ReportOptions } from '@/lib/validation/report';
import { formatCount, formatShare } from '../format';
import type { BlockReportInput, MeasuredObservation } from './input';
import type { ObservationKind } from '@/lib/viticulture';

/**
 * One figure of the report. `how` is the working in plain words and units, with the inputs put in
 * ("1,386 vines × 1.75 min = 40 h"); `from` names the records behind it; `source` the published
 * method, or says there is none.
 */
export interface Figure {
  label: string;
  value: number | null;
  text: string;
  how: string;
  from: string;
  source: string;
}

export interface HistogramBin {
  label: string;
  from: number;
  to: number;
  count: number;
}

export const num = (v: unknown): number | undefined => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);
export const vineKey = (row: number, position: number | null) => `${row}:${position ?? '*'}`;

/** Each vine's latest record of one kind. */
export function latestPerVine(measured: MeasuredObservation[], kind: ObservationKind): MeasuredObservation[] {
  const latest = new Map<string, MeasuredObservation>();
  for (const o of measured) {
    if (o.kind !== kind) continue;
    const key = vineKey(o.row, o.position);
    const seen = latest.get(key);
    if (!seen || seen.observedAt <= o.observedAt) latest.set(key, o);
  }
  return [...latest.values()].sort((a, b) => a.row - b.row || a.position - b.position);
}

export function mean(values: number[]): number | null {
  return values.length ? values.reduce((a, b) => a + b, 0) / values.length : null;
}

export function median(values: number[]): number | null {
  if (!values.length) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

export function formulaFor(options: ReportOptions, settings: ViticultureSettings): BalancedPruningFormula & { grapeType: GrapeType | null } {
  if (options.grapeType) return { ...BALANCED_PRUNING_FORMULAS[options.grapeType as GrapeType], grapeType: options.grapeType as GrapeType };
  const match = (Object.entries(BALANCED_PRUNING_FORMULAS) as [GrapeType, BalancedPruningFormula][]).find(([, f]) => f === settings.pruning.formula);
  return { ...settings.pruning.formula, grapeType: match?.[0] ?? null };
}

/** "3 of 40 vines scouted had it: 3 ÷ 40 = 7.5%; the 95% range around it, by Wilson's score interval, is 2.6% to 19.9%". */
export function shareWorking(part: number, whole: number, of: string, interval: ProportionInterval): string {
  return `${formatCount(part)} of ${formatCount(whole)} ${of}: ${formatCount(part)} ÷ ${formatCount(whole)} = ${formatShare(interval.estimate)}; the 95% range around it, by Wilson's score interval, is ${formatShare(interval.lower)} to ${formatShare(interval.upper)}`;
}

export interface WeightLookup {
  vine: Map<string, number>;
  row: Map<number, { kg: number; vines: number }>;
}

/** Pruning weights of one season by vine and by row sample: measurements first, then pruning records. */
export function pruningWeights(input: BlockReportInput, season: number): WeightLookup {
  const vine = new Map<string, number>();
  const row = new Map<number, { kg: number; vines: number }>();
  for (const m of input.measurements) {
    if (m.kind !== 'pruning-weight' || m.season !== season) continue;
    if (m.position === null) {
      const r = row.get(m.row) ?? { kg: 0, vines: 0 };
      r.kg += m.weightKg;
      r.vines += m.vines;
      row.set(m.row, r);
    } else {
      const key = vineKey(m.row, m.position);
      vine.set(key, (vine.get(key) ?? 0) + m.weightKg);
    }
  }
  for (const w of input.recordedWeights) {
    if (w.season !== season) continue;
    const key = vineKey(w.row, w.position);
    if (!vine.has(key)) vine.set(key, w.weightKg);
  }
  return { vine, row };
}
