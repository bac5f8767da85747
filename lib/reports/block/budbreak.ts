/** Budbreak: shoots pushed from the buds retained, each vine's latest spring check. */
import { budbreakPercent, isWeakBudbreak, wilsonInterval, type ProportionInterval, type ViticultureSettings } from '@/lib/viticulture';
import { formatCount, formatNumber, formatPercent, formatShare } from '../format';
import { latestPerVine, num, shareWorking, type Figure, type HistogramBin } from './common';
import type { BlockReportInput } from './input';
import { SOURCES } from './sources';

export interface BudbreakSection {
  vinesChecked: number;
  budsRetained: number;
  budsPushed: number;
  pooled: Figure;
  weakVines: number;
  weakShare: ProportionInterval;
  weakFigure: Figure;
  weakBelowPercent: number;
  histogram: HistogramBin[];
}

export function budbreakSection(input: BlockReportInput, s: ViticultureSettings): BudbreakSection | null {
  const checks = latestPerVine(input.measured, 'weak-budbreak')
    .map((o) => ({ retained: num(o.data.budsRetained), pushed: num(o.data.budsPushed) }))
    .filter((c): c is { retained: number; pushed: number } => c.retained !== undefined && c.pushed !== undefined && c.retained > 0 && c.pushed <= c.retained);
  if (!checks.length) return null;
  const retained = checks.reduce((a, c) => a + c.retained, 0);
  const pushed = checks.reduce((a, c) => a + c.pushed, 0);
  const pooled = budbreakPercent(retained, pushed);
  const weak = checks.filter((c) => isWeakBudbreak(c.retained, c.pushed, s)).length;
  const weakShare = wilsonInterval(weak, checks.length);
  const histogram: HistogramBin[] = Array.from({ length: 10 }, (_, i) => ({ label: `${i * 10}–${i * 10 + 10}%`, from: i * 10, to: i * 10 + 10, count: 0 }));
  for (const c of checks) histogram[Math.min(9, Math.floor(budbreakPercent(c.retained, c.pushed) / 10))]!.count++;
  const threshold = s.budbreak.weakBelowPercent;
  return {
    vinesChecked: checks.length,
    budsRetained: retained,
    budsPushed: pushed,
    pooled: {
      label: 'Budbreak over all vines checked',
      value: pooled,
      text: formatPercent(pooled),
      how: budbreakWorking(retained, pushed),
      from: `${formatCount(checks.length)} vines checked for budbreak in ${input.season}, each vine's latest check`,
      source: SOURCES.budbreak,
    },
    weakVines: weak,
    weakShare,
    weakFigure: {
      label: 'Share of weak vines',
      value: weakShare.estimate,
      text: `${formatShare(weakShare.estimate)} (95% range ${formatShare(weakShare.lower)}–${formatShare(weakShare.upper)})`,
      how: `A vine is weak when fewer than ${formatNumber(threshold)}% of its buds pushed. ${shareWorking(weak, checks.length, 'vines checked were weak', weakShare)}`,
      from: `${formatCount(weak)} of ${formatCount(checks.length)} vines checked in ${input.season} pushed under ${formatNumber(threshold)}% of their buds`,
      source: `${SOURCES.wilson}; ${SOURCES.weakBudbreak}`,
    },
    weakBelowPercent: threshold,
    histogram,
  };
}

/** "1,020 of 1,300 buds retained pushed a shoot: 1,020 ÷ 1,300 × 100 = 78.5%". */
export function budbreakWorking(retained: number, pushed: number): string {
  return `${formatCount(pushed)} of ${formatCount(retained)} buds retained pushed a shoot: ${formatCount(pushed)} ÷ ${formatCount(retained)} × 100 = ${formatPercent(budbreakPercent(retained, pushed))}`;
}
