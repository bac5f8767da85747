/**
 * Pruning checks: a crew lead counts what a pruner left on a vine (canes or spurs, the buds on them,
 * renewal spurs) against the bud target the crew was given. Records of the work, not problems: the
 * report says how close the crews came, never an "incidence". Every check counts.
 */
import { budDeviationPercent, pruningCheckBuds, type ViticultureSettings } from '@/lib/viticulture';
import { formatCount, formatNumber } from '../format';
import { mean, num, type Figure } from './common';
import type { BlockReportInput } from './input';
import { SOURCES } from './sources';

export interface PruningCheckSection {
  checks: number;
  pruners: number;
  meanLeft: Figure;
  kept: { canes: number; budsOnCanes: number; renewalSpurs: number };
  withTarget: number;
  meanTarget: number | null;
  within: number;
  under: number;
  over: number;
  fineWithinPercent: number;
  how: string;
  source: string;
}

export function pruningCheckSection(input: BlockReportInput, s: ViticultureSettings): PruningCheckSection | null {
  const checks = input.measured
    .filter((o) => o.kind === 'pruning-check')
    .map((o) => ({
      by: typeof o.data.prunedBy === 'string' ? o.data.prunedBy : '',
      canes: num(o.data.canesKept),
      buds: num(o.data.budsOnCanes),
      spurs: num(o.data.renewalSpurs) ?? 0,
      target: num(o.data.budTarget),
    }))
    .filter((c): c is { by: string; canes: number; buds: number; spurs: number; target: number | undefined } => c.canes !== undefined && c.buds !== undefined);
  if (!checks.length) return null;
  const left = checks.map((c) => pruningCheckBuds({ canesKept: c.canes, budsOnCanes: c.buds, renewalSpurs: c.spurs }, s));
  const total = left.reduce((a, b) => a + b, 0);
  const meanLeft = total / checks.length;
  const fine = s.pruningRecord.fineWithinPercent;
  const offs = checks.flatMap((c, i) => (c.target !== undefined && c.target > 0 ? [{ off: budDeviationPercent(left[i]!, c.target), target: c.target }] : []));
  const spurBuds = s.plan.budsPerRenewalSpur;
  return {
    checks: checks.length,
    pruners: new Set(checks.map((c) => c.by).filter(Boolean)).size,
    meanLeft: {
      label: 'Buds left per vine checked',
      value: meanLeft,
      text: formatNumber(meanLeft),
      how: `On each vine: buds on the canes or spurs kept + renewal spurs × ${spurBuds} buds. Over the checks: ${formatCount(total)} buds ÷ ${formatCount(checks.length)} vines = ${formatNumber(meanLeft)} buds a vine`,
      from: `${formatCount(checks.length)} pruning checks of ${input.season}`,
      source: SOURCES.pruningCheck,
    },
    kept: {
      canes: mean(checks.map((c) => c.canes))!,
      budsOnCanes: mean(checks.map((c) => c.buds))!,
      renewalSpurs: mean(checks.map((c) => c.spurs))!,
    },
    withTarget: offs.length,
    meanTarget: mean(offs.map((o) => o.target)),
    within: offs.filter((o) => Math.abs(o.off) <= fine).length,
    under: offs.filter((o) => o.off < -fine).length,
    over: offs.filter((o) => o.off > fine).length,
    fineWithinPercent: fine,
    how: `How far off: (buds left − the target the crew was given) ÷ that target × 100; within ${fine}% is on target`,
    source: SOURCES.offTargetBands,
  };
}
