/**
 * The crop and pruning-labour estimates of a block report. Pure and cheap, so the page recomputes
 * them in the browser as someone edits an input, with exactly the figures the server printed.
 */
import {
  DEFAULT_SETTINGS,
  cropShortTonsPerAcre,
  cropTonnesPerHa,
  estimateCropKg,
  estimatePruningLabour,
  harvestClusterWeightG,
  haToAc,
  SQ_M_PER_HA,
  type ViticultureSettings,
} from '@/lib/viticulture';
import { formatCount, formatNumber } from './format';

export type { TrainingSystem } from '@/lib/validation/block';
import type { TrainingSystem } from '@/lib/validation/block';

/** Where a default input came from, in words a reader can follow. */
export interface InputValue {
  value: number | null;
  /** "entered", or where the default came from. */
  source: string;
  /** What the report uses when nothing is entered, and where that comes from. */
  defaultValue: number | null;
  defaultSource: string;
}

/** An input's default, or what was entered over it. */
export function inputValue(entered: number | undefined, defaultValue: number | null, defaultSource: string): InputValue {
  return entered !== undefined
    ? { value: entered, source: 'entered', defaultValue, defaultSource }
    : { value: defaultValue, source: defaultSource, defaultValue, defaultSource };
}

export interface CropBasis {
  /** Bearing vines: planted slots plus replants old enough to crop. */
  vines: number;
  vinesSource: string;
  areaM2: number;
  /** Harvest over lag-phase cluster weight (settings.crop.lagPhaseMultiplier). */
  lagPhaseMultiplier?: number;
}

export interface CropInputs {
  budsPerVine: InputValue;
  budbreakPercent: InputValue;
  clustersPerShoot: InputValue;
  clusterWeightG: InputValue;
  /** Clusters counted per vine: when given, it stands for buds × budbreak × clusters per shoot. */
  clustersPerVine?: InputValue;
  /** Cluster weight at lag phase: when given, the harvest weight is it × the lag-phase multiplier. */
  lagClusterWeightG?: InputValue;
}

export interface CropEstimate {
  /** Null until every input has a value. */
  kg: number | null;
  kgPerVine: number | null;
  tonnesPerHa: number | null;
  shortTonsPerAcre: number | null;
  missing: string[];
  how: string;
}

export function cropEstimate(basis: CropBasis, inputs: CropInputs): CropEstimate {
  const direct = inputs.clustersPerVine?.value ?? null;
  const lag = inputs.lagClusterWeightG?.value ?? null;
  const needed: [string, InputValue | undefined][] =
    direct !== null
      ? []
      : [
          ['budsPerVine', inputs.budsPerVine],
          ['budbreakPercent', inputs.budbreakPercent],
          ['clustersPerShoot', inputs.clustersPerShoot],
        ];
  if (lag === null) needed.push(['clusterWeightG', inputs.clusterWeightG]);
  const missing = needed.filter(([, v]) => v?.value === null || v?.value === undefined).map(([k]) => k);
  if (missing.length) {
    return {
      kg: null,
      kgPerVine: null,
      tonnesPerHa: null,
      shortTonsPerAcre: null,
      missing,
      how: `The estimate needs ${missing.map(inputWords).join(' and ')}.`,
    };
  }
  const multiplier = basis.lagPhaseMultiplier ?? DEFAULT_SETTINGS.crop.lagPhaseMultiplier;
  const clusterWeightG = lag !== null ? harvestClusterWeightG(lag, { crop: { lagPhaseMultiplier: multiplier } }) : inputs.clusterWeightG.value!;
  const input =
    direct !== null
      ? { vines: basis.vines, clustersPerVine: direct, clusterWeightG }
      : {
          vines: basis.vines,
          budsPerVine: inputs.budsPerVine.value!,
          budbreakFraction: inputs.budbreakPercent.value! / 100,
          clustersPerShoot: inputs.clustersPerShoot.value!,
          clusterWeightG,
        };
  const kg = estimateCropKg(input);
  const areaHa = basis.areaM2 / SQ_M_PER_HA;
  const tonnesPerHa = areaHa > 0 ? cropTonnesPerHa(kg, areaHa) : null;
  const clusters =
    direct !== null
      ? `${formatNumber(direct, 1)} clusters counted a vine`
      : `${formatNumber(inputs.budsPerVine.value!, 1)} buds kept a vine × ${formatNumber(inputs.budbreakPercent.value!, 1)}% budbreak × ${formatNumber(inputs.clustersPerShoot.value!, 2)} clusters a shoot`;
  const lagHow =
    lag !== null
      ? ` The harvest cluster weight is ${formatNumber(lag, 1)} g at lag phase × ${formatNumber(multiplier, 2)} = ${formatNumber(clusterWeightG, 1)} g.`
      : '';
  const perArea = tonnesPerHa !== null ? ` Over ${formatNumber(areaHa, 2)} ha of planted slots that is ${formatNumber(tonnesPerHa, 1)} t/ha.` : '';
  return {
    kg,
    kgPerVine: basis.vines > 0 ? kg / basis.vines : null,
    tonnesPerHa,
    shortTonsPerAcre: areaHa > 0 ? cropShortTonsPerAcre(kg, haToAc(areaHa)) : null,
    missing: [],
    how: `${formatCount(basis.vines)} bearing vines × ${clusters} × ${formatNumber(clusterWeightG, 1)} g a cluster = ${formatNumber(kg, 0)} kg.${lagHow}${perArea}`,
  };
}

const INPUT_WORDS: Record<string, string> = {
  budsPerVine: 'the buds kept per vine',
  budbreakPercent: 'the budbreak',
  clustersPerShoot: 'the clusters per shoot',
  clusterWeightG: 'the cluster weight',
  clustersPerVine: 'the clusters counted per vine',
  lagClusterWeightG: 'the cluster weight at lag phase',
};

/** An estimate input named in words: "the clusters per shoot". */
export const inputWords = (key: string) => INPUT_WORDS[key] ?? key;

/** The inputs the estimate uses and where each came from: counted clusters stand in for their components, a lag-phase weight for the harvest weight. */
export function cropRestsOn(inputs: CropInputs): string {
  const unused = new Set<string>([
    ...(inputs.clustersPerVine?.value != null ? ['budsPerVine', 'budbreakPercent', 'clustersPerShoot'] : []),
    ...(inputs.lagClusterWeightG?.value != null ? ['clusterWeightG'] : []),
  ]);
  return (Object.entries(inputs) as [string, InputValue | undefined][])
    .filter(([k, v]) => v && v.value !== null && !unused.has(k))
    .map(([k, v]) => `${inputWords(k).replace(/^the /, '')} ${formatNumber(v!.value!, 2)}: ${v!.source}`)
    .join('; ');
}

export interface LabourBasis {
  /** Standing vines: every slot with a vine in it gets pruned. */
  vines: number;
  trainingSystem: TrainingSystem;
  areaM2: number;
}

export interface LabourInputs {
  minutesPerVine: InputValue;
  hourlyCost: InputValue;
}

export interface LabourEstimate {
  hours: number | null;
  cost: number | null;
  hoursPerHa: number | null;
  hoursPerAcre: number | null;
  /** The same block at the other system's default minutes, so the cost of cane pruning shows. */
  alternative: { trainingSystem: 'cane' | 'spur'; minutesPerVine: number; hours: number; cost: number } | null;
  how: string;
}

/** Default minutes per vine for a training system; an unknown system is costed as the slower cane pruning. */
export function defaultMinutesPerVine(system: TrainingSystem, settings: ViticultureSettings = DEFAULT_SETTINGS): number {
  return system === 'spur' ? settings.labour.spurMinutesPerVine : settings.labour.caneMinutesPerVine;
}

export function labourEstimate(basis: LabourBasis, inputs: LabourInputs, settings: ViticultureSettings = DEFAULT_SETTINGS): LabourEstimate {
  const minutes = inputs.minutesPerVine.value;
  const hourlyCost = inputs.hourlyCost.value;
  if (minutes === null || hourlyCost === null) {
    return {
      hours: null,
      cost: null,
      hoursPerHa: null,
      hoursPerAcre: null,
      alternative: null,
      how: 'The estimate needs the minutes per vine and the hourly cost.',
    };
  }
  const input = { vines: basis.vines, minutesPerVine: minutes, hourlyCost };
  const { hours, cost } = estimatePruningLabour(input);
  const areaHa = basis.areaM2 / SQ_M_PER_HA;
  const other = basis.trainingSystem === 'spur' ? 'cane' : 'spur';
  const otherMinutes = defaultMinutesPerVine(other, settings);
  const alt = estimatePruningLabour({ vines: basis.vines, minutesPerVine: otherMinutes, hourlyCost });
  return {
    hours,
    cost,
    hoursPerHa: areaHa > 0 ? hours / areaHa : null,
    hoursPerAcre: areaHa > 0 ? hours / haToAc(areaHa) : null,
    alternative: { trainingSystem: other, minutesPerVine: otherMinutes, hours: alt.hours, cost: alt.cost },
    how: labourWorking(basis.vines, minutes, hourlyCost),
  };
}

/** "1,386 vines × 1.75 min = 40 h; at 25 an hour, 1,011". */
export function labourWorking(vines: number, minutesPerVine: number, hourlyCost: number): string {
  const { hours, cost } = estimatePruningLabour({ vines, minutesPerVine, hourlyCost });
  return `${formatCount(vines)} vines × ${formatNumber(minutesPerVine, 2)} min = ${formatNumber(hours, hours < 10 ? 1 : 0)} h; at ${formatNumber(hourlyCost, 2)} an hour, ${formatNumber(cost, 0)}`;
}

/** Acres in a number of square metres, for the per-acre figures. */
export const areaAcres = (areaM2: number) => haToAc(areaM2 / SQ_M_PER_HA);
export const areaHa = (areaM2: number) => areaM2 / SQ_M_PER_HA;
