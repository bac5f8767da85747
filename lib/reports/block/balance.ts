/**
 * Harvest and vine balance. Ravaz pairs a vintage's crop with the wood that grew beside it, weighed
 * at the next winter's pruning: vintage V uses yields of season V and pruning weights of season
 * V + 1. Vines pair with vines and row samples with row samples of the same row.
 */
import { isConcordType, ravazIndex, ravazRangeFor, readRavaz, type GrapeType, type RavazReading, type ViticultureSettings } from '@/lib/viticulture';
import type { UnitSystem } from '@/lib/units';
import { formatCount, formatNumber, formatWeightKg } from '../format';
import { formulaFor, pruningWeights, vineKey, type Figure } from './common';
import type { BlockReportInput } from './input';
import { SOURCES } from './sources';

export interface RavazUnit {
  row: number;
  position: number | null;
  vines: number;
  yieldKgPerVine: number;
  pruningKgPerVine: number;
  index: number;
  reading: RavazReading;
}

export interface RavazSection {
  vintage: number;
  pruningSeason: number;
  units: RavazUnit[];
  index: Figure;
  reading: RavazReading;
  readings: Record<RavazReading, number>;
  range: { underBelow: number; overAbove: number };
  /** Where the range comes from: the block's grape type. */
  rangeSource: string;
  note: string;
}

export interface HarvestSection {
  entries: number;
  vines: number;
  totalKg: number;
  kgPerVine: Figure;
  clusterWeightG: Figure | null;
}

export const RAVAZ_WORDS: Record<RavazReading, string> = {
  'under-cropped': 'under-cropped (more wood than fruit)',
  balanced: 'balanced',
  'over-cropped': 'over-cropped (more fruit than the wood can ripen)',
};

interface Unit {
  row: number;
  position: number | null;
  kg: number;
  vines: number;
}

function units(rows: Unit[]): Map<string, Unit> {
  const out = new Map<string, Unit>();
  for (const r of rows) {
    const key = vineKey(r.row, r.position);
    const u = out.get(key) ?? { row: r.row, position: r.position, kg: 0, vines: 0 };
    u.kg += r.kg;
    // A vine picked twice is still one vine; a row sampled twice covers both samples' vines.
    u.vines = r.position === null ? u.vines + r.vines : 1;
    out.set(key, u);
  }
  return out;
}

/** "9.8 kg of fruit a vine ÷ 1.3 kg of prunings a vine = 7.5: balanced (5 to 10)". */
export function ravazWorking(yieldKgPerVine: number, pruningKgPerVine: number, range: { underBelow: number; overAbove: number }): string {
  const index = ravazIndex(yieldKgPerVine, pruningKgPerVine);
  const reading = readRavaz(index, { ravaz: range });
  return `${formatNumber(yieldKgPerVine, 2)} kg of fruit a vine ÷ ${formatNumber(pruningKgPerVine, 2)} kg of prunings a vine = ${formatNumber(index)}; between ${range.underBelow} and ${range.overAbove} reads as balanced, so this is ${RAVAZ_WORDS[reading]}`;
}

/** The range a block's index is read against, and where the published one comes from. */
export function ravazSource(grapeType: GrapeType | null, range: { underBelow: number; overAbove: number }): string {
  const used = `${range.underBelow}–${range.overAbove}`;
  return isConcordType(grapeType)
    ? `Concord-type grapes: ${used}; published 10–20, balanced near 15 (${SOURCES.ravazConcord})`
    : `${grapeType ?? 'the block'}: ${used}; published 5–10 for vinifera (${SOURCES.ravazVinifera})`;
}

export function ravazFor(input: BlockReportInput, vintage: number, s: ViticultureSettings): RavazSection | null {
  const { grapeType } = formulaFor(input.options, s);
  const range = ravazRangeFor(grapeType, s);
  const read = (index: number) => readRavaz(index, { ravaz: range });
  const yields = units(
    input.measurements
      .filter((m) => m.kind === 'yield' && m.season === vintage)
      .map((m) => ({ row: m.row, position: m.position, kg: m.weightKg, vines: m.vines })),
  );
  const weights = pruningWeights(input, vintage + 1);
  const prunings = units([
    ...[...weights.vine.entries()].map(([key, kg]) => {
      const [row, position] = key.split(':').map(Number) as [number, number];
      return { row, position, kg, vines: 1 };
    }),
    ...[...weights.row.entries()].map(([row, w]) => ({ row, position: null, kg: w.kg, vines: w.vines })),
  ]);
  const paired: RavazUnit[] = [];
  for (const [key, y] of yields) {
    const p = prunings.get(key);
    if (!p || p.kg <= 0) continue;
    const yieldKgPerVine = y.kg / y.vines;
    const pruningKgPerVine = p.kg / p.vines;
    const index = ravazIndex(yieldKgPerVine, pruningKgPerVine);
    paired.push({ row: y.row, position: y.position, vines: y.vines, yieldKgPerVine, pruningKgPerVine, index, reading: read(index) });
  }
  if (!paired.length) return null;
  paired.sort((a, b) => a.row - b.row || (a.position ?? 0) - (b.position ?? 0));
  const vines = paired.reduce((a, u) => a + u.vines, 0);
  const meanYield = paired.reduce((a, u) => a + u.yieldKgPerVine * u.vines, 0) / vines;
  const meanPruning = paired.reduce((a, u) => a + u.pruningKgPerVine * u.vines, 0) / vines;
  const index = ravazIndex(meanYield, meanPruning);
  const readings: Record<RavazReading, number> = { 'under-cropped': 0, balanced: 0, 'over-cropped': 0 };
  for (const u of paired) readings[u.reading]++;
  return {
    vintage,
    pruningSeason: vintage + 1,
    units: paired,
    index: {
      label: `Ravaz index, ${vintage} vintage`,
      value: index,
      text: formatNumber(index),
      how: `Fruit weight over the weight of the one-year wood that grew with it: ${ravazWorking(meanYield, meanPruning, range)}`,
      from: `mean yield and mean pruning weight per vine over ${formatCount(vines)} vines weighed at the ${vintage} harvest and at the ${vintage + 1} winter pruning (${formatCount(paired.length)} vines or row samples)`,
      source: isConcordType(grapeType) ? SOURCES.ravazConcord : SOURCES.ravazVinifera,
    },
    reading: read(index),
    readings,
    range,
    rangeSource: ravazSource(grapeType, range),
    note: `Yields of the ${vintage} harvest over the one-year wood weighed at the ${vintage + 1} winter pruning.`,
  };
}

export function harvestSection(input: BlockReportInput, unitSystem: UnitSystem): HarvestSection | null {
  const yields = input.measurements.filter((m) => m.kind === 'yield' && m.season === input.season);
  if (!yields.length) return null;
  const vines = yields.reduce((a, m) => a + m.vines, 0);
  const totalKg = yields.reduce((a, m) => a + m.weightKg, 0);
  const counted = yields.filter((m) => m.clusters !== null && m.clusters > 0);
  const countedKg = counted.reduce((a, m) => a + m.weightKg, 0);
  const clusters = counted.reduce((a, m) => a + m.clusters!, 0);
  const perVine = totalKg / vines;
  return {
    entries: yields.length,
    vines,
    totalKg,
    kgPerVine: {
      label: 'Harvest per vine weighed',
      value: perVine,
      text: formatWeightKg(perVine, unitSystem, 2),
      how: `Total weight ÷ vines weighed: ${formatNumber(totalKg, 2)} kg ÷ ${formatCount(vines)} vines = ${formatNumber(perVine, 2)} kg a vine`,
      from: `${formatCount(yields.length)} yield entries of the ${input.season} harvest`,
      source: SOURCES.counting,
    },
    clusterWeightG: clusters
      ? {
          label: 'Mean cluster weight',
          value: (countedKg * 1000) / clusters,
          text: `${formatNumber((countedKg * 1000) / clusters, 0)} g`,
          how: `Weight ÷ clusters: ${formatNumber(countedKg * 1000, 0)} g ÷ ${formatCount(clusters)} clusters = ${formatNumber((countedKg * 1000) / clusters, 0)} g a cluster`,
          from: `${formatCount(counted.length)} yield entries that counted clusters`,
          source: SOURCES.counting,
        }
      : null,
  };
}
