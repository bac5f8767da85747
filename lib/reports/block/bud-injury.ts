/** Winter bud injury: primary buds cut open before pruning, and next winter's bud target after it. */
import { budInjuryAdjustment, DEFAULT_SETTINGS, primaryBudKillPercent, type BudInjuryAdvice, type ViticultureSettings } from '@/lib/viticulture';
import { inputValue, type InputValue } from '../estimates';
import { formatCount, formatNumber, formatPercent } from '../format';
import { num, type Figure } from './common';
import type { BudLoadSection } from './bud-load';
import type { BlockReportInput } from './input';
import { SOURCES } from './sources';

export interface BudInjurySection {
  samples: number;
  budsCut: number;
  primariesDead: number;
  kill: Figure;
  target: InputValue;
  adjusted: BudInjuryTarget | null;
  /** Extra buds from this kill, minimal pruning above that (the estate's settings). */
  limits: { extraFromPercent: number; minimalAbovePercent: number };
  byRow: { row: number; samples: number; budsCut: number; primariesDead: number; killPercent: number }[];
}

export interface BudInjuryTarget {
  buds: number | null;
  advice: BudInjuryAdvice;
  how: string;
  source: string;
}

export function budInjurySection(input: BlockReportInput, budLoad: BudLoadSection | null, s: ViticultureSettings): BudInjurySection | null {
  const samples = input.measured
    .filter((o) => o.kind === 'bud-injury')
    .map((o) => ({ row: o.row, cut: num(o.data.budsCut), dead: num(o.data.primariesDead) }))
    .filter((x): x is { row: number; cut: number; dead: number } => x.cut !== undefined && x.dead !== undefined && x.cut > 0 && x.dead <= x.cut);
  if (!samples.length) return null;
  const cut = samples.reduce((a, x) => a + x.cut, 0);
  const dead = samples.reduce((a, x) => a + x.dead, 0);
  const kill = primaryBudKillPercent(cut, dead);
  const byRowMap = new Map<number, { row: number; samples: number; budsCut: number; primariesDead: number }>();
  for (const x of samples) {
    const r = byRowMap.get(x.row) ?? { row: x.row, samples: 0, budsCut: 0, primariesDead: 0 };
    r.samples++;
    r.budsCut += x.cut;
    r.primariesDead += x.dead;
    byRowMap.set(x.row, r);
  }
  const target =
    budLoad?.meanTarget?.value != null
      ? inputValue(
          input.options.budTarget,
          Math.round(budLoad.meanTarget.value),
          `the block's mean balanced-pruning target (${formatNumber(budLoad.meanTarget.value)}), rounded`,
        )
      : budLoad
        ? inputValue(
            input.options.budTarget,
            Math.round(budLoad.meanKept.value!),
            `the block's mean buds kept per vine (${formatNumber(budLoad.meanKept.value!)}), rounded`,
          )
        : inputValue(input.options.budTarget, null, 'no pruning records this season: enter a bud target per vine');
  return {
    samples: samples.length,
    budsCut: cut,
    primariesDead: dead,
    kill: {
      label: 'Primary buds dead',
      value: kill,
      text: formatPercent(kill),
      how: killWorking(cut, dead),
      from: `${formatCount(samples.length)} winter bud-injury samples of ${input.season}`,
      source: SOURCES.budKill,
    },
    target,
    adjusted: adjustForBudInjury(target.value, kill, s),
    limits: { ...s.budInjury },
    byRow: [...byRowMap.values()].sort((a, b) => a.row - b.row).map((r) => ({ ...r, killPercent: primaryBudKillPercent(r.budsCut, r.primariesDead) })),
  };
}

/** "16 of 40 primary buds cut open were dead: 16 ÷ 40 × 100 = 40%". */
export function killWorking(cut: number, dead: number): string {
  return `${formatCount(dead)} of ${formatCount(cut)} primary buds cut open were dead: ${formatCount(dead)} ÷ ${formatCount(cut)} × 100 = ${formatPercent(primaryBudKillPercent(cut, dead))}`;
}

/** Next winter's bud target after winter injury; also run in the browser as the target is edited. */
export function adjustForBudInjury(targetBuds: number | null, killPercent: number, settings: ViticultureSettings = DEFAULT_SETTINGS): BudInjuryTarget | null {
  if (targetBuds === null) return null;
  const { extraFromPercent, minimalAbovePercent } = settings.budInjury;
  const result = budInjuryAdjustment(targetBuds, killPercent, settings);
  const kill = formatPercent(killPercent);
  const how =
    result.advice === 'prune-normally'
      ? `${kill} dead is under ${extraFromPercent}%: keep the target of ${formatCount(targetBuds)} buds`
      : result.advice === 'leave-extra'
        ? `${kill} dead is between ${extraFromPercent}% and ${minimalAbovePercent}%: leave that share more buds, ${formatCount(targetBuds)} + ${kill} = ${formatCount(targetBuds)} × ${formatNumber(1 + killPercent / 100, 3)} = ${formatCount(result.buds!)} buds (rounded half up)`
        : `${kill} dead is over ${minimalAbovePercent}%: no bud count; prune minimally, or wait until after budbreak and thin what pushed`;
  return { ...result, how, source: SOURCES.budInjury };
}
