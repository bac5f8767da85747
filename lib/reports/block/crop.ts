/**
 * The crop estimate's inputs, each from the block's records where they exist, else a default named
 * as one; the vines to sample for next season's estimate; and the crop the vines' size can ripen.
 */
import {
  budbreakPercent,
  coefficientOfVariationPercent,
  cropLoadTargetKg,
  isConcordType,
  isWeakBudbreak,
  RAVAZ_TARGETS,
  ravazRangeFor,
  sampleSizeForMean,
  type ViticultureSettings,
} from '@/lib/viticulture';
import {
  defaultMinutesPerVine,
  inputValue,
  type CropBasis,
  type CropEstimate,
  type CropInputs,
  type InputValue,
  type LabourBasis,
  type LabourEstimate,
  type LabourInputs,
} from '../estimates';
import { formatCount, formatNumber } from '../format';
import type { RecordedLabour } from '@/lib/work/recorded';
import { formulaFor, num, pruningWeights, vineKey } from './common';
import type { BudLoadSection } from './bud-load';
import { ravazSource } from './balance';
import type { BlockReportInput, MeasuredObservation } from './input';
import { SOURCES } from './sources';

/** Vines to sample for next season's crop estimate, from the spread of vine yields. */
export interface CropSampling {
  vines: number;
  cvPercent: number;
  cvSource: string;
  marginPercent: number;
  how: string;
  source: string;
}

/** The crop the vines' size can ripen: the Ravaz range (or target) × mean pruning weight per vine. */
export interface CropLoadTarget {
  pruningKgPerVine: number;
  lowKgPerVine: number;
  highKgPerVine: number;
  /** At the published single target (Concord 15), else null. */
  targetKgPerVine: number | null;
  how: string;
  from: string;
  source: string;
}

export interface CropSection {
  basis: CropBasis;
  inputs: CropInputs;
  estimate: CropEstimate;
  restsOn: string;
  sampling: CropSampling;
  target: CropLoadTarget | null;
  source: string;
}

export interface LabourSection {
  basis: LabourBasis;
  inputs: LabourInputs;
  estimate: LabourEstimate;
  recorded: RecordedLabour | null;
  source: string;
}

/**
 * Budbreak for the crop estimate: every record that counted buds retained and pushed, each vine's
 * latest, whatever its kind. Counts made only on weak vines would pull the estimate down, so when
 * every counted vine is under the weak limit the counts are not taken as the block's budbreak.
 */
function cropBudbreak(input: BlockReportInput, s: ViticultureSettings, entered: number | undefined): InputValue {
  const latest = new Map<string, MeasuredObservation>();
  for (const o of input.measured) {
    if (num(o.data.budsRetained) === undefined || num(o.data.budsPushed) === undefined) continue;
    const key = vineKey(o.row, o.position);
    const seen = latest.get(key);
    if (!seen || seen.observedAt <= o.observedAt) latest.set(key, o);
  }
  const counts = [...latest.values()]
    .map((o) => ({ retained: num(o.data.budsRetained)!, pushed: num(o.data.budsPushed)! }))
    .filter((c) => c.retained > 0 && c.pushed <= c.retained);
  if (!counts.length) return inputValue(entered, null, 'no budbreak counts this season: enter the budbreak expected');
  const retained = counts.reduce((a, c) => a + c.retained, 0);
  const pushed = counts.reduce((a, c) => a + c.pushed, 0);
  const weak = counts.filter((c) => isWeakBudbreak(c.retained, c.pushed, s)).length;
  if (weak === counts.length) {
    return inputValue(
      entered,
      null,
      `all ${formatCount(counts.length)} vines counted pushed under ${s.budbreak.weakBelowPercent}% (weak-budbreak records only): a count of weak vines alone would understate the block; enter the budbreak of a random sample`,
    );
  }
  const pooled = budbreakPercent(retained, pushed);
  return inputValue(
    entered,
    Number(pooled.toFixed(1)),
    `${formatCount(pushed)} of ${formatCount(retained)} buds pushed over every budbreak count of ${input.season}: ${formatCount(counts.length)} vines, ${formatCount(weak)} of them weak`,
  );
}

// Fewer than five vines say little about the spread; the default is safer then.
const MIN_CV_VINES = 5;

/**
 * The spread of a block's vine yields: last season's single-vine yields, else this season's (a
 * pilot sample), when at least five vines were weighed; null when neither was.
 */
export function measuredYieldSpread(
  yieldsOf: (season: number) => readonly number[],
  season: number,
): { cvPercent: number; vines: number; season: number } | null {
  for (const s of [season - 1, season]) {
    const yields = yieldsOf(s);
    if (yields.length >= MIN_CV_VINES && yields.some((y) => y > 0))
      return { cvPercent: coefficientOfVariationPercent(yields), vines: yields.length, season: s };
  }
  return null;
}

/** Vines to weigh for a crop estimate, from the CV of vine yields: last season's, else this season's, else the default. */
function cropSampling(input: BlockReportInput, s: ViticultureSettings, bearing: number): CropSampling {
  const perVine = (season: number) =>
    input.measurements.filter((m) => m.kind === 'yield' && m.season === season && m.position !== null && m.vines > 0).map((m) => m.weightKg / m.vines);
  const measured = measuredYieldSpread(perVine, input.season);
  const cvPercent = measured?.cvPercent ?? s.crop.yieldCvPercent;
  const cvSource = measured
    ? `the spread of ${formatCount(measured.vines)} single-vine yields of ${measured.season} (standard deviation ÷ mean)`
    : `a default of ${s.crop.yieldCvPercent}% (from memory); weigh at least ${MIN_CV_VINES} single vines for the block's own`;
  const marginPercent = s.crop.sampleMarginPercent;
  const vines = sampleSizeForMean(cvPercent, marginPercent, 0.95, bearing > 0 ? bearing : undefined);
  const raw = ((1.96 * cvPercent) / marginPercent) ** 2;
  return {
    vines,
    cvPercent,
    cvSource,
    marginPercent,
    how: `(1.96 × ${formatNumber(cvPercent, 1)}% ÷ ${formatNumber(marginPercent)}%)² = ${formatNumber(raw, 1)} vines${bearing > 0 ? `; for a block of ${formatCount(bearing)} bearing vines, ${formatNumber(raw, 1)} ÷ (1 + ${formatNumber(raw - 1, 1)} ÷ ${formatCount(bearing)})` : ''}, rounded up: ${formatCount(vines)} vines`,
    source: SOURCES.sampleSize,
  };
}

/** The crop the block's vines can ripen this season, from this season's pruning weights and the Ravaz range of the grape type. */
function cropLoadTarget(input: BlockReportInput, s: ViticultureSettings): CropLoadTarget | null {
  const weights = pruningWeights(input, input.season);
  let kg = 0;
  let vines = 0;
  for (const w of weights.vine.values()) {
    kg += w;
    vines++;
  }
  for (const r of weights.row.values()) {
    kg += r.kg;
    vines += r.vines;
  }
  if (vines === 0 || kg <= 0) return null;
  const pruningKgPerVine = kg / vines;
  const { grapeType } = formulaFor(input.options, s);
  const range = ravazRangeFor(grapeType, s);
  const target = isConcordType(grapeType) ? RAVAZ_TARGETS.concord : null;
  const low = cropLoadTargetKg(pruningKgPerVine, Math.max(range.underBelow, Number.EPSILON));
  const high = cropLoadTargetKg(pruningKgPerVine, range.overAbove);
  const p = formatNumber(pruningKgPerVine, 2);
  return {
    pruningKgPerVine,
    lowKgPerVine: low,
    highKgPerVine: high,
    targetKgPerVine: target === null ? null : cropLoadTargetKg(pruningKgPerVine, target),
    how: `${p} kg of prunings a vine × a Ravaz index of ${range.underBelow} to ${range.overAbove} = ${formatNumber(low, 1)} to ${formatNumber(high, 1)} kg of fruit a vine${target === null ? '' : `; × ${target}, the balanced index, = ${formatNumber(cropLoadTargetKg(pruningKgPerVine, target), 1)} kg`}`,
    from: `mean pruning weight of ${formatCount(vines)} vines weighed at the ${input.season} winter pruning; Ravaz range for ${ravazSource(grapeType, range)}`,
    source: target === null ? SOURCES.ravazVinifera : SOURCES.ravazConcord,
  };
}

/**
 * Buds kept when the block has no pruning records: the middle of Ohio State's 4–6 buds per foot of
 * row, at the block's vine spacing. A default, marked as one, so an estimate can start.
 */
function defaultBudsPerVine(input: BlockReportInput, s: ViticultureSettings): { buds: number; source: string } {
  const { minBudsPerFt, maxBudsPerFt } = s.budLoad;
  const perFt = (minBudsPerFt + maxBudsPerFt) / 2;
  const spacingFt = input.block.vineSpacingM / 0.3048;
  const buds = Number((perFt * spacingFt).toFixed(1));
  return {
    buds,
    source: `default, as no pruning records were made this season: ${formatNumber(perFt)} buds a foot of row (the middle of Ohio State's ${minBudsPerFt}–${maxBudsPerFt}) × ${formatNumber(spacingFt, 2)} ft between vines; enter the buds your crew keeps`,
  };
}

export function cropInputs(input: BlockReportInput, budLoad: BudLoadSection | null, s: ViticultureSettings): CropInputs {
  const o = input.options;
  const previousHarvest = input.measurements.filter((m) => m.kind === 'yield' && m.season === input.season - 1 && m.clusters !== null && m.clusters > 0);
  const previousClusters = previousHarvest.reduce((a, m) => a + m.clusters!, 0);
  const previousClusterG = previousClusters ? (previousHarvest.reduce((a, m) => a + m.weightKg, 0) * 1000) / previousClusters : null;
  const fallbackBuds = budLoad ? null : defaultBudsPerVine(input, s);
  return {
    budsPerVine: budLoad
      ? inputValue(o.budsPerVine, Number(budLoad.meanKept.value!.toFixed(1)), `mean buds kept on ${formatCount(budLoad.vinesRecorded)} pruning records`)
      : inputValue(o.budsPerVine, fallbackBuds!.buds, fallbackBuds!.source),
    budbreakPercent: cropBudbreak(input, s, o.budbreakPercent),
    clustersPerShoot: inputValue(
      o.clustersPerShoot,
      s.crop.clustersPerShoot,
      'default (from memory: fruitful shoots carry one to two clusters); count your own',
    ),
    clusterWeightG:
      previousClusterG !== null
        ? inputValue(
            o.clusterWeightG,
            Math.round(previousClusterG),
            `mean cluster weight of the ${input.season - 1} harvest samples (${formatCount(previousHarvest.reduce((a, m) => a + m.vines, 0))} vines, ${formatCount(previousClusters)} clusters)`,
          )
        : inputValue(o.clusterWeightG, s.crop.clusterWeightG, 'default (from memory: a middling wine-grape cluster); weigh your own'),
    clustersPerVine: inputValue(o.clustersPerVine, null, 'not counted: built from buds × budbreak × clusters per shoot'),
    lagClusterWeightG: inputValue(
      o.lagClusterWeightG,
      null,
      `not weighed: enter clusters weighed at lag phase to use × ${s.crop.lagPhaseMultiplier} (University of Maryland Extension, "cluster weights will double from lag phase to harvest")`,
    ),
  };
}

export function labourInputs(input: BlockReportInput, s: ViticultureSettings): LabourInputs {
  const o = input.options;
  const system = input.block.trainingSystem;
  return {
    minutesPerVine: inputValue(
      o.minutesPerVine,
      defaultMinutesPerVine(system, s),
      system === 'spur'
        ? 'default for spur pruning (common practice, no source)'
        : `default for cane pruning (from memory: 1.5 to 2 times spur pruning)${system === 'other' ? ', the slower kind, for an unlisted system' : ''}`,
    ),
    hourlyCost: inputValue(o.hourlyCost, s.labour.hourlyCost, 'a placeholder: enter your crew rate'),
  };
}

export function cropExtras(input: BlockReportInput, s: ViticultureSettings, bearing: number) {
  return { sampling: cropSampling(input, s, bearing), target: cropLoadTarget(input, s) };
}
