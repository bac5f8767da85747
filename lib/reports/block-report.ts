/**
 * A block's season report, assembled from the rows the report queries return. Each section lives in
 * lib/reports/block/<section>.ts; every figure carries `how` (its working in plain words and units),
 * `from` (the records behind it) and `source` (the published method), so the page, the API and the
 * tests read the same numbers and the same words.
 *
 * Counting rules, stated once:
 * - A vine is "scouted" in a season when it has any live record then, of any kind or status, other
 *   than a missing-vine record: a hole is found without looking at a vine.
 * - Incidence counts findings only (block/incidence.ts); pruning records and pruning checks are
 *   records of the work, reported as buds kept against the target.
 * - Budbreak, pruning records and winter bud-injury samples: each vine counts once, with its
 *   latest record of the season. Canes count one per record (each record is one cane).
 */
import { DEFAULT_SETTINGS } from '@/lib/viticulture';
import type { UnitSystem } from '@/lib/units';
import { cropEstimate, cropRestsOn, labourEstimate, type CropBasis, type LabourBasis } from './estimates';
import { formatCount, formatShare } from './format';
import { seasonBounds } from './season';
import { ravazFor, harvestSection, type HarvestSection, type RavazSection } from './block/balance';
import { budInjurySection, type BudInjurySection } from './block/bud-injury';
import { budLoadSection, type BudLoadSection } from './block/bud-load';
import { budbreakSection, type BudbreakSection } from './block/budbreak';
import { caneSection, type CaneSection } from './block/canes';
import type { Figure } from './block/common';
import { cropExtras, cropInputs, labourInputs, type CropSection, type LabourSection } from './block/crop';
import { incidenceSection, type IncidenceSection } from './block/incidence';
import type { BlockReportInput, ReportBlock, SlotCounts } from './block/input';
import { pruningCheckSection, type PruningCheckSection } from './block/pruning-checks';
import { replantSection, taskSection, type ReplantSection, type TaskSection } from './block/replant';
import { SOURCES } from './block/sources';

export type * from './block/input';
export type { Figure, HistogramBin } from './block/common';
export type { IncidenceBase, KindIncidence, RowIncidence, IncidenceSection } from './block/incidence';
export type { BudbreakSection } from './block/budbreak';
export type { CaneSection } from './block/canes';
export type { BudLoadSection, BudLoadVine } from './block/bud-load';
export type { PruningCheckSection } from './block/pruning-checks';
export type { RavazSection, RavazUnit, HarvestSection } from './block/balance';
export type { BudInjurySection, BudInjuryTarget } from './block/bud-injury';
export type { CropLoadTarget, CropSampling, CropSection, LabourSection } from './block/crop';
export type { ReplantSection, TaskSection } from './block/replant';
export { baseOf } from './block/incidence';
export { adjustForBudInjury } from './block/bud-injury';
export { formulaFor } from './block/common';

export interface BlockReport {
  block: ReportBlock & { areaM2: number };
  season: number;
  period: { from: string; to: string };
  units: UnitSystem;
  slots: SlotCounts & { standing: number; bearing: number; total: number };
  scouting: { vinesScouted: number; observations: number; coverage: Figure };
  incidence: IncidenceSection;
  budbreak: BudbreakSection | null;
  canes: CaneSection | null;
  budLoad: BudLoadSection | null;
  pruningChecks: PruningCheckSection | null;
  ravaz: RavazSection | null;
  ravazNote: string;
  harvest: HarvestSection | null;
  crop: CropSection;
  labour: LabourSection;
  budInjury: BudInjurySection | null;
  tasks: TaskSection;
  replant: ReplantSection;
}

export function buildBlockReport(input: BlockReportInput): BlockReport {
  const s = input.settings ?? DEFAULT_SETTINGS;
  const { block, slots } = input;
  const total = slots.planted + slots.replant + slots.missing + slots.dead;
  const areaM2 = total * block.rowSpacingM * block.vineSpacingM;
  const standing = slots.planted + slots.replant;
  const bearing = slots.planted + slots.bearingReplants;
  const { vinesScouted, ...incidence } = incidenceSection(input);
  const budLoad = budLoadSection(input, s);
  const crop = cropInputs(input, budLoad, s);
  const cropBasis: CropBasis = {
    lagPhaseMultiplier: s.crop.lagPhaseMultiplier,
    vines: bearing,
    vinesSource: `${formatCount(slots.planted)} planted slots + ${formatCount(slots.bearingReplants)} replants planted in ${input.season - s.crop.bearingAfterSeasons} or before (a replant crops from its third leaf: common practice, no source)`,
    areaM2,
  };
  const labourBasis: LabourBasis = { vines: standing, trainingSystem: block.trainingSystem, areaM2 };
  const labour = labourInputs(input, s);
  const current = ravazFor(input, input.season, s);
  const ravaz = current ?? ravazFor(input, input.season - 1, s);
  const coverage = total ? standing : 0;
  return {
    block: { ...block, areaM2 },
    season: input.season,
    period: seasonBounds(input.season, input.seasonStartMonth),
    units: input.units,
    slots: { ...slots, standing, bearing, total },
    scouting: {
      vinesScouted,
      observations: input.observations,
      coverage: {
        label: 'Vines scouted',
        value: coverage ? vinesScouted / coverage : null,
        text: coverage ? `${formatCount(vinesScouted)} of ${formatCount(coverage)} standing vines (${formatShare(vinesScouted / coverage)})` : '–',
        how: coverage
          ? `Vines with any record this season, missing-vine records aside, over the standing vines (planted and replant slots): ${formatCount(vinesScouted)} ÷ ${formatCount(coverage)} = ${formatShare(vinesScouted / coverage)}`
          : 'The block has no standing vines.',
        from: `${formatCount(input.observations)} live records of ${input.season}`,
        source: SOURCES.counting,
      },
    },
    incidence,
    budbreak: budbreakSection(input, s),
    canes: caneSection(input, s),
    budLoad,
    pruningChecks: pruningCheckSection(input, s),
    ravaz,
    ravazNote: current
      ? `The ${input.season} vintage, with the prunings weighed at the ${input.season + 1} winter pruning.`
      : ravaz
        ? `The ${input.season} vintage needs the prunings weighed at the ${input.season + 1} winter pruning; shown is the ${input.season - 1} vintage.`
        : `No vine or row sample has both a yield (${input.season - 1} or ${input.season} harvest) and the next winter's pruning weight. Enter weights under "Yields and pruning weights".`,
    harvest: harvestSection(input, input.units),
    crop: {
      basis: cropBasis,
      inputs: crop,
      estimate: cropEstimate(cropBasis, crop),
      restsOn: cropRestsOn(crop),
      ...cropExtras(input, s, bearing),
      source: SOURCES.cropEstimate,
    },
    labour: {
      basis: labourBasis,
      inputs: labour,
      estimate: labourEstimate(labourBasis, labour, s),
      recorded: input.recordedLabour ?? null,
      source: SOURCES.labour,
    },
    budInjury: budInjurySection(input, budLoad, s),
    tasks: taskSection(input.tasks),
    replant: replantSection(input),
  };
}
