/**
 * Bud load: what the pruners kept on each recorded vine (canes, buds on them, renewal spurs) against
 * the balanced-pruning target from its prunings' weight. Each vine counts once, its latest record.
 */
import {
  balancedPruningBuds,
  budDeviationPercent,
  checkBudLoad,
  kgToLb,
  pruningCheckBuds,
  type BalancedPruningFormula,
  type BudLoadCheck,
  type GrapeType,
  type ViticultureSettings,
} from '@/lib/viticulture';
import { formatCount, formatNumber } from '../format';
import { formulaFor, latestPerVine, mean, num, pruningWeights, vineKey, type Figure } from './common';
import type { BlockReportInput } from './input';
import { SOURCES } from './sources';

export interface BudLoadVine {
  row: number;
  position: number;
  kept: number;
  canesKept: number;
  budsPerCane: number;
  renewalSpurs: number;
  weightKg: number | null;
  weightSource: 'record' | 'vine' | 'row-sample' | null;
  target: number | null;
  deviationPercent: number | null;
}

export interface BudLoadSection {
  vinesRecorded: number;
  meanKept: Figure;
  /** Means over the records: what "buds kept" is made of. */
  kept: { canes: number; budsPerCane: number; renewalSpurs: number; budsPerRenewalSpur: number };
  withTarget: number;
  meanTarget: Figure | null;
  formula: BalancedPruningFormula & { grapeType: GrapeType | null };
  bands: { label: string; vines: number }[];
  under: number;
  over: number;
  vines: BudLoadVine[];
  /** Buds per foot of row against the published range, for the buds kept and for the target. */
  density: { kept: BudLoadCheck; target: BudLoadCheck | null; warning: string | null; how: string; source: string };
  /** How the bands are drawn, in words. */
  how: string;
  source: string;
}

/** The balanced-pruning rule in words: "20 buds for the first pound of prunings and 20 for each further pound". */
export function formulaWords(formula: BalancedPruningFormula): string {
  const unit = formula.unit === 'lb' ? 'pound' : 'kilogram';
  return `${formula.firstUnitBuds} buds for the first ${unit} of prunings and ${formula.perAdditionalUnitBuds} for each further ${unit}`;
}

/** One vine's target worked out: "1 kg of prunings is 2.2 lb: 20 + 20 × 1.2 = 44 buds (rounded down)". */
export function targetWorking(weightKg: number, formula: BalancedPruningFormula): string {
  const weight = formula.unit === 'lb' ? kgToLb(weightKg) : weightKg;
  const unit = formula.unit === 'lb' ? 'lb' : 'kg';
  const target = balancedPruningBuds(weightKg, formula, 'kg');
  const first = `${formatNumber(weightKg, 2)} kg of prunings${formula.unit === 'lb' ? ` is ${formatNumber(weight, 2)} lb` : ''}`;
  return weight >= 1
    ? `${first}: ${formula.firstUnitBuds} + ${formula.perAdditionalUnitBuds} × ${formatNumber(weight - 1, 2)} = ${formatCount(target)} buds (rounded down)`
    : `${first}, under one ${unit}: ${formula.firstUnitBuds} × ${formatNumber(weight, 2)} = ${formatCount(target)} buds (rounded down)`;
}

export function budLoadSection(input: BlockReportInput, s: ViticultureSettings): BudLoadSection | null {
  const records = latestPerVine(input.measured, 'pruning-record');
  if (!records.length) return null;
  const formula = formulaFor(input.options, s);
  const weights = pruningWeights(input, input.season);
  const vines: BudLoadVine[] = [];
  for (const o of records) {
    const canesKept = num(o.data.canesKept);
    const budsPerCane = num(o.data.budsPerCane);
    const renewalSpurs = num(o.data.renewalSpurs) ?? 0;
    if (canesKept === undefined || budsPerCane === undefined) continue;
    const kept = pruningCheckBuds({ canesKept, budsOnCanes: canesKept * budsPerCane, renewalSpurs }, s);
    const own = num(o.data.pruningWeightKg);
    const measured = weights.vine.get(vineKey(o.row, o.position));
    const sample = weights.row.get(o.row);
    const [weightKg, weightSource] =
      own !== undefined
        ? [own, 'record' as const]
        : measured !== undefined
          ? [measured, 'vine' as const]
          : sample
            ? [sample.kg / sample.vines, 'row-sample' as const]
            : [null, null];
    const target = weightKg !== null ? balancedPruningBuds(weightKg, formula, 'kg') : (num(o.data.budTarget) ?? null);
    vines.push({
      row: o.row,
      position: o.position,
      kept,
      canesKept,
      budsPerCane,
      renewalSpurs,
      weightKg,
      weightSource,
      target,
      deviationPercent: target !== null && target > 0 ? budDeviationPercent(kept, target) : null,
    });
  }
  if (!vines.length) return null;
  const withTarget = vines.filter((v) => v.deviationPercent !== null);
  const { fineWithinPercent, watchWithinPercent, actWithinPercent } = s.pruningRecord;
  const band = (lo: number, hi: number) => withTarget.filter((v) => Math.abs(v.deviationPercent!) > lo && Math.abs(v.deviationPercent!) <= hi).length;
  const meanKept = mean(vines.map((v) => v.kept))!;
  const totalKept = vines.reduce((a, v) => a + v.kept, 0);
  const targets = vines.filter((v) => v.target !== null).map((v) => v.target!);
  const meanTarget = mean(targets);
  const spacing = input.block.vineSpacingM;
  const keptCheck = checkBudLoad(meanKept, spacing, s);
  const targetCheck = meanTarget === null ? null : checkBudLoad(meanTarget, spacing, s);
  const { minBudsPerFt, maxBudsPerFt } = s.budLoad;
  const over = (c: BudLoadCheck | null) => c !== null && c.reading === 'over';
  const warning =
    over(targetCheck) || over(keptCheck)
      ? `${over(targetCheck) ? `The balanced-pruning target (${formatNumber(meanTarget!)} buds a vine)` : `The buds kept (${formatNumber(meanKept)} a vine)`} come to ${formatNumber((over(targetCheck) ? targetCheck! : keptCheck).budsPerFt)} buds per foot of row, above the ${minBudsPerFt}–${maxBudsPerFt} a foot (${keptCheck.rangePerVine.min}–${keptCheck.rangePerVine.max} a vine at this spacing) that Ohio State's pruning primer gives. Check the prunings' weights and the grape type's formula before pruning to it.`
      : null;
  const spurBuds = s.plan.budsPerRenewalSpur;
  const kept = {
    canes: mean(vines.map((v) => v.canesKept))!,
    budsPerCane: mean(vines.map((v) => v.budsPerCane))!,
    renewalSpurs: mean(vines.map((v) => v.renewalSpurs))!,
    budsPerRenewalSpur: spurBuds,
  };
  const example = vines.find((v) => v.weightKg !== null);
  const spacingFt = spacing / 0.3048;
  return {
    vinesRecorded: vines.length,
    meanKept: {
      label: 'Buds kept per vine',
      value: meanKept,
      text: formatNumber(meanKept),
      how: `On each vine: canes kept × buds on each cane + renewal spurs × ${spurBuds} buds. On average ${formatNumber(kept.canes)} canes × ${formatNumber(kept.budsPerCane)} buds + ${formatNumber(kept.renewalSpurs)} renewal spurs × ${spurBuds}. Over the block: ${formatCount(totalKept)} buds ÷ ${formatCount(vines.length)} vines = ${formatNumber(meanKept)} buds a vine`,
      from: `${formatCount(vines.length)} pruning records of ${input.season}, each vine's latest`,
      source: SOURCES.counting,
    },
    kept,
    withTarget: withTarget.length,
    meanTarget:
      meanTarget === null
        ? null
        : {
            label: 'Balanced-pruning target per vine',
            value: meanTarget,
            text: formatNumber(meanTarget),
            how: `Each weighed vine's target is ${formulaWords(formula)}${example ? `; for example ${targetWorking(example.weightKg!, formula)}` : ''}. Averaged: ${formatCount(targets.reduce((a, b) => a + b, 0))} buds ÷ ${formatCount(targets.length)} vines = ${formatNumber(meanTarget)} buds a vine`,
            from: `${formatCount(targets.length)} vines whose prunings were weighed (on the record, as a vine weight or as a row sample) or whose record carried a target${formula.grapeType ? `; the ${formula.grapeType} formula` : ''}`,
            source: SOURCES.balancedPruning,
          },
    formula,
    bands: [
      { label: `Within ${fineWithinPercent}% of target`, vines: withTarget.filter((v) => Math.abs(v.deviationPercent!) <= fineWithinPercent).length },
      { label: `${fineWithinPercent}–${watchWithinPercent}% off`, vines: band(fineWithinPercent, watchWithinPercent) },
      { label: `${watchWithinPercent}–${actWithinPercent}% off`, vines: band(watchWithinPercent, actWithinPercent) },
      { label: `More than ${actWithinPercent}% off`, vines: withTarget.filter((v) => Math.abs(v.deviationPercent!) > actWithinPercent).length },
    ],
    under: withTarget.filter((v) => v.deviationPercent! < -fineWithinPercent).length,
    over: withTarget.filter((v) => v.deviationPercent! > fineWithinPercent).length,
    vines,
    density: {
      kept: keptCheck,
      target: targetCheck,
      warning,
      how: `${formatNumber(meanKept)} buds a vine ÷ ${formatNumber(spacingFt, 2)} ft between vines = ${formatNumber(keptCheck.budsPerFt)} buds a foot of row, against ${minBudsPerFt}–${maxBudsPerFt} a foot: ${minBudsPerFt} × ${formatNumber(spacingFt, 2)} to ${maxBudsPerFt} × ${formatNumber(spacingFt, 2)} = ${keptCheck.rangePerVine.min}–${keptCheck.rangePerVine.max} buds a vine`,
      source: SOURCES.budDensity,
    },
    how: `How far off: (buds kept − target) ÷ target × 100, for each vine with a target`,
    source: SOURCES.offTargetBands,
  };
}
