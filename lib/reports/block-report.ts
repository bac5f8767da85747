/**
 * A block's season report, assembled from the rows the report queries return. Every figure is
 * computed here by a lib/viticulture function and carries `how` (the call with its inputs) and
 * `from` (the records behind it), so the page, the API and the tests read the same numbers.
 *
 * Counting rules, stated once:
 * - A vine is "scouted" in a season when it has any live record then, of any kind or status, other
 *   than a missing-vine record: a hole is found without looking at a vine.
 * - A vine "has" a kind when its worst record of that kind in the season is at least "watch" (1).
 *   Closed records count: the report is the season's history, not today's to-do list.
 * - Incidence of a kind is over the vines scouted; missing or dead vines are over the slots, since
 *   the stand of every slot is known whether or not anyone looked at the vine beside it.
 * - Budbreak, pruning records and winter bud-injury samples: each vine counts once, with its
 *   latest record of the season. Canes count one per record (each record is one cane).
 */
import {
  assessCane,
  BALANCED_PRUNING_FORMULAS,
  balancedPruningBuds,
  budDeviationPercent,
  budInjuryAdjustment,
  budbreakPercent,
  caneReasonCode,
  checkBudLoad,
  coefficientOfVariationPercent,
  cropLoadTargetKg,
  DEFAULT_SETTINGS,
  RAVAZ_TARGETS,
  ravazRangeFor,
  sampleSizeForMean,
  isWeakBudbreak,
  primaryBudKillPercent,
  pruningCheckBuds,
  ravazIndex,
  readRavaz,
  wilsonInterval,
  type BalancedPruningFormula,
  type BudInjuryAdvice,
  type BudLoadCheck,
  type CaneVerdict,
  type Exposure,
  type GrapeType,
  type ObservationKind,
  type ProportionInterval,
  type RavazReading,
  type ViticultureSettings,
  type WoodOrigin,
} from '@/lib/viticulture';
import type { UnitSystem } from '@/lib/units';
import type { ReportOptions } from '@/lib/validation/report';
import { kindLabel } from '@/lib/grid/labels';
import {
  cropEstimate,
  cropRestsOn,
  defaultMinutesPerVine,
  labourEstimate,
  type CropBasis,
  type CropEstimate,
  type CropInputs,
  type LabourBasis,
  type LabourEstimate,
  type LabourInputs,
  type TrainingSystem,
  inputValue,
  type InputValue,
} from './estimates';
import { call, formatCount, formatNumber, formatPercent, formatShare, formatWeightKg } from './format';
import { seasonBounds } from './season';
import type { RecordedLabour } from '@/lib/work/recorded';

// Query rows --------------------------------------------------------------------------------------

export interface ReportBlock {
  id: string;
  name: string;
  variety: string;
  clone: string | null;
  rootstock: string | null;
  plantingYear: number | null;
  trainingSystem: TrainingSystem;
  rowSpacingM: number;
  vineSpacingM: number;
  rowCount: number;
  vinesPerRow: number;
  vinesPerPanel: number | null;
}

export interface SlotCounts {
  planted: number;
  replant: number;
  missing: number;
  dead: number;
  /** Replants planted at least `crop.bearingAfterSeasons` seasons before this one. */
  bearingReplants: number;
}

/** Per row and kind: vines with a record of the kind, those at "watch" or worse, and the records. */
export interface KindRowCount {
  row: number;
  kind: string;
  recorded: number;
  affected: number;
  observations: number;
}

/** Per row: vines scouted (any record but a missing-vine one) and planting slots. */
export interface ScoutedRow {
  row: number;
  vines: number;
  slots: number;
}

export interface MeasuredObservation {
  row: number;
  position: number;
  kind: ObservationKind;
  data: Record<string, unknown>;
  observedAt: string;
}

export interface MeasurementRow {
  kind: 'yield' | 'pruning-weight';
  season: number;
  row: number;
  /** Null for a row sample. */
  position: number | null;
  vines: number;
  weightKg: number;
  clusters: number | null;
}

/** A pruning record that carried its vine's pruning weight. */
export interface RecordedPruningWeight {
  season: number;
  row: number;
  position: number;
  weightKg: number;
}

export interface ReplantSlot {
  row: number;
  position: number;
  clone: string | null;
  rootstock: string | null;
  /** Why it is on the list: the slot's status, a scout's missing/dead record, or an open replant flag. */
  reason: 'missing' | 'dead' | 'recorded-missing' | 'recorded-dead' | 'flagged';
}

export interface TaskRow {
  id: string;
  title: string;
  status: 'open' | 'done' | 'cancelled';
  priority: string;
  dueOn: string | null;
  assignee: string | null;
  items: number;
  itemsDone: number;
  closedAt: string | null;
}

export interface PersistedVine {
  row: number;
  position: number;
  kind: string;
  before: number;
  now: number;
}

export interface BlockReportInput {
  block: ReportBlock;
  season: number;
  /** 1–12, the month the organisation's seasons start in; January when absent. */
  seasonStartMonth?: number;
  units: UnitSystem;
  slots: SlotCounts;
  kindRows: KindRowCount[];
  scoutedRows: ScoutedRow[];
  observations: number;
  measured: MeasuredObservation[];
  /** Weights of seasons season − 1 … season + 1 (Ravaz pairs a harvest with the next winter's prunings). */
  measurements: MeasurementRow[];
  recordedWeights: RecordedPruningWeight[];
  replant: ReplantSlot[];
  /** Null when the tasks table is not there (an older database). */
  tasks: TaskRow[] | null;
  /** Row work the crews recorded this season; absent when not loaded. */
  recordedLabour?: RecordedLabour | null;
  options: ReportOptions;
  settings?: ViticultureSettings;
}

// Report ------------------------------------------------------------------------------------------

export interface Figure {
  label: string;
  value: number | null;
  text: string;
  how: string;
  from: string;
}

/** What a kind's incidence is a share of: the vines scouted, or (for missing and dead vines) the slots. */
export type IncidenceBase = 'vines-scouted' | 'slots';

export interface KindIncidence {
  kind: string;
  label: string;
  vinesAffected: number;
  vinesRecorded: number;
  base: IncidenceBase;
  /** The count the incidence is a share of. */
  outOf: number;
  observations: number;
  incidence: ProportionInterval;
  how: string;
}

export interface RowIncidence {
  row: number;
  vinesScouted: number;
  slots: number;
  kinds: Record<string, { affected: number; outOf: number; incidence: ProportionInterval }>;
}

export const baseOf = (kind: string): IncidenceBase => (kind === 'missing-vine' ? 'slots' : 'vines-scouted');

export interface HistogramBin {
  label: string;
  from: number;
  to: number;
  count: number;
}

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

export interface CaneSection {
  canes: number;
  measured: number;
  meanDiameterMm: number | null;
  medianDiameterMm: number | null;
  bands: HistogramBin[];
  histogram: HistogramBin[];
  verdicts: Record<CaneVerdict, number>;
  assessed: number;
  shadeCanes: number;
  shadeShare: ProportionInterval;
  shadeFigure: Figure;
  how: string;
}

export interface BudLoadVine {
  row: number;
  position: number;
  kept: number;
  weightKg: number | null;
  weightSource: 'record' | 'vine' | 'row-sample' | null;
  target: number | null;
  deviationPercent: number | null;
}

export interface BudLoadSection {
  vinesRecorded: number;
  meanKept: Figure;
  withTarget: number;
  meanTarget: Figure | null;
  formula: BalancedPruningFormula & { grapeType: GrapeType | null };
  bands: { label: string; vines: number }[];
  under: number;
  over: number;
  vines: BudLoadVine[];
  /** Buds per foot of row against the published range, for the buds kept and for the target. */
  density: { kept: BudLoadCheck; target: BudLoadCheck | null; warning: string | null; how: string };
  how: string;
}

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

export interface BudInjurySection {
  samples: number;
  budsCut: number;
  primariesDead: number;
  kill: Figure;
  target: InputValue;
  adjusted: { buds: number | null; advice: BudInjuryAdvice; how: string } | null;
  /** settings.budInjury: extra buds from this kill, minimal pruning above that. */
  limits: { extraFromPercent: number; minimalAbovePercent: number };
  byRow: { row: number; samples: number; budsCut: number; primariesDead: number; killPercent: number }[];
}

/** Vines to sample for next season's crop estimate, from the spread of vine yields. */
export interface CropSampling {
  vines: number;
  cvPercent: number;
  cvSource: string;
  marginPercent: number;
  how: string;
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
}

export interface ReplantSection {
  total: number;
  byStock: { clone: string; rootstock: string; vines: number }[];
  byRow: { row: number; positions: number[] }[];
  reasons: Record<ReplantSlot['reason'], number>;
  how: string;
}

export interface TaskSection {
  available: boolean;
  open: number;
  done: number;
  cancelled: number;
  list: TaskRow[];
}

export interface BlockReport {
  block: ReportBlock & { areaM2: number };
  season: number;
  period: { from: string; to: string };
  units: UnitSystem;
  slots: SlotCounts & { standing: number; bearing: number; total: number };
  scouting: { vinesScouted: number; observations: number; coverage: Figure };
  /** `slots` is the count missing and dead vines are a share of. */
  incidence: { kinds: KindIncidence[]; rows: RowIncidence[]; slots: number };
  budbreak: BudbreakSection | null;
  canes: CaneSection | null;
  budLoad: BudLoadSection | null;
  ravaz: RavazSection | null;
  ravazNote: string;
  harvest: HarvestSection | null;
  crop: { basis: CropBasis; inputs: CropInputs; estimate: CropEstimate; restsOn: string; sampling: CropSampling; target: CropLoadTarget | null };
  labour: { basis: LabourBasis; inputs: LabourInputs; estimate: LabourEstimate; recorded: RecordedLabour | null };
  budInjury: BudInjurySection | null;
  tasks: TaskSection;
  replant: ReplantSection;
}

// Assembly ----------------------------------------------------------------------------------------

const num = (v: unknown): number | undefined => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);
const vineKey = (row: number, position: number | null) => `${row}:${position ?? '*'}`;

/** Each vine's latest record of one kind. */
function latestPerVine(measured: MeasuredObservation[], kind: ObservationKind): MeasuredObservation[] {
  const latest = new Map<string, MeasuredObservation>();
  for (const o of measured) {
    if (o.kind !== kind) continue;
    const key = vineKey(o.row, o.position);
    const seen = latest.get(key);
    if (!seen || seen.observedAt <= o.observedAt) latest.set(key, o);
  }
  return [...latest.values()].sort((a, b) => a.row - b.row || a.position - b.position);
}

function mean(values: number[]): number | null {
  return values.length ? values.reduce((a, b) => a + b, 0) / values.length : null;
}

function median(values: number[]): number | null {
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

function incidenceSection(input: BlockReportInput) {
  const byRow = new Map(input.scoutedRows.map((r) => [r.row, r]));
  const vinesScouted = input.scoutedRows.reduce((a, r) => a + r.vines, 0);
  const slots = input.scoutedRows.reduce((a, r) => a + r.slots, 0);
  const totals = new Map<string, { affected: number; recorded: number; observations: number }>();
  const rows = new Map<number, RowIncidence>(
    input.scoutedRows.filter((r) => r.vines > 0).map((r) => [r.row, { row: r.row, vinesScouted: r.vines, slots: r.slots, kinds: {} }]),
  );
  for (const r of input.kindRows) {
    if (r.kind === 'note') continue;
    const t = totals.get(r.kind) ?? { affected: 0, recorded: 0, observations: 0 };
    t.affected += r.affected;
    t.recorded += r.recorded;
    t.observations += r.observations;
    totals.set(r.kind, t);
    const counts = byRow.get(r.row);
    const outOf = baseOf(r.kind) === 'slots' ? (counts?.slots ?? 0) : (counts?.vines ?? 0);
    if (!counts || outOf === 0) continue;
    const row = rows.get(r.row) ?? { row: r.row, vinesScouted: counts.vines, slots: counts.slots, kinds: {} };
    row.kinds[r.kind] = { affected: r.affected, outOf, incidence: wilsonInterval(Math.min(r.affected, outOf), outOf) };
    rows.set(r.row, row);
  }
  const kinds: KindIncidence[] = [];
  for (const [kind, t] of totals) {
    const base = baseOf(kind);
    const outOf = base === 'slots' ? slots : vinesScouted;
    if (outOf === 0) continue;
    const affected = Math.min(t.affected, outOf);
    kinds.push({
      kind,
      label: kindLabel(kind),
      vinesAffected: t.affected,
      vinesRecorded: t.recorded,
      base,
      outOf,
      observations: t.observations,
      incidence: wilsonInterval(affected, outOf),
      how: call('wilsonInterval', affected, outOf, 0.95),
    });
  }
  kinds.sort((a, b) => b.incidence.estimate - a.incidence.estimate || a.label.localeCompare(b.label));
  return { vinesScouted, slots, kinds, rows: [...rows.values()].sort((a, b) => a.row - b.row) };
}

function budbreakSection(input: BlockReportInput, s: ViticultureSettings): BudbreakSection | null {
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
      how: call('budbreakPercent', retained, pushed),
      from: `${formatCount(pushed)} of ${formatCount(retained)} buds retained pushed a shoot, on ${formatCount(checks.length)} vines checked for budbreak in ${input.season} (each vine's latest check)`,
    },
    weakVines: weak,
    weakShare,
    weakFigure: {
      label: 'Share of weak vines',
      value: weakShare.estimate,
      text: `${formatShare(weakShare.estimate)} (95% CI ${formatShare(weakShare.lower)}–${formatShare(weakShare.upper)})`,
      how: `isWeakBudbreak(retained, pushed) per vine, under ${threshold}%; ${call('wilsonInterval', weak, checks.length, 0.95)}`,
      from: `${formatCount(weak)} of ${formatCount(checks.length)} vines checked pushed under ${threshold}% of their buds (settings.budbreak.weakBelowPercent: common practice, no source)`,
    },
    weakBelowPercent: threshold,
    histogram,
  };
}

function caneSection(input: BlockReportInput, s: ViticultureSettings): CaneSection | null {
  const records = input.measured.filter((o) => o.kind === 'cane-diameter' || o.kind === 'shade-cane');
  if (!records.length) return null;
  const diameters: number[] = [];
  const verdicts: Record<CaneVerdict, number> = { 'fruit-cane': 0, 'if-nothing-better': 0, remove: 0 };
  let assessed = 0;
  let shade = 0;
  for (const o of records) {
    const diameter = num(o.data.diameterMm);
    if (diameter !== undefined && diameter > 0) diameters.push(diameter);
    if (o.kind === 'shade-cane') {
      shade++;
      continue;
    }
    if (diameter === undefined || diameter <= 0) continue;
    const verdict = assessCane(
      {
        baseDiameterMm: diameter,
        longestInternodeMm: num(o.data.longestInternodeMm),
        exposure: o.data.exposure as Exposure | undefined,
        colourGood: typeof o.data.colourGood === 'boolean' ? o.data.colourGood : undefined,
        flat: typeof o.data.flat === 'boolean' ? o.data.flat : undefined,
        origin: o.data.origin as WoodOrigin | undefined,
        injured: typeof o.data.injured === 'boolean' ? o.data.injured : undefined,
      },
      s,
    );
    assessed++;
    verdicts[verdict.verdict]++;
    if (verdict.reasons.some((r) => caneReasonCode(r) === 'shade-cane')) shade++;
  }
  const { veryThinBelowMm, thinBelowMm, bullAboveMm } = s.canes;
  const bands: HistogramBin[] = [
    { label: `Very thin (under ${formatNumber(veryThinBelowMm)} mm)`, from: 0, to: veryThinBelowMm, count: 0 },
    { label: `Thin (under ${formatNumber(thinBelowMm, 2)} mm)`, from: veryThinBelowMm, to: thinBelowMm, count: 0 },
    { label: `Fruit-cane size (${formatNumber(thinBelowMm, 2)}–${formatNumber(bullAboveMm)} mm)`, from: thinBelowMm, to: bullAboveMm, count: 0 },
    { label: `Bull cane (over ${formatNumber(bullAboveMm)} mm)`, from: bullAboveMm, to: Infinity, count: 0 },
  ];
  for (const d of diameters) {
    const band = d < veryThinBelowMm ? 0 : d < thinBelowMm ? 1 : d <= bullAboveMm ? 2 : 3;
    bands[band]!.count++;
  }
  const low = diameters.length ? Math.floor(Math.min(...diameters)) : 0;
  const high = diameters.length ? Math.floor(Math.max(...diameters)) : 0;
  const histogram: HistogramBin[] = [];
  for (let mm = low; mm <= high && diameters.length; mm++) {
    histogram.push({ label: `${mm}–${mm + 1}`, from: mm, to: mm + 1, count: diameters.filter((d) => d >= mm && d < mm + 1).length });
  }
  const shadeShare = wilsonInterval(shade, records.length);
  return {
    canes: records.length,
    measured: diameters.length,
    meanDiameterMm: mean(diameters),
    medianDiameterMm: median(diameters),
    bands,
    histogram,
    verdicts,
    assessed,
    shadeCanes: shade,
    shadeShare,
    shadeFigure: {
      label: 'Shade-cane share of canes recorded',
      value: shadeShare.estimate,
      text: `${formatShare(shadeShare.estimate)} (95% CI ${formatShare(shadeShare.lower)}–${formatShare(shadeShare.upper)})`,
      how: `shade-cane records, plus cane-diameter records that assessCane gives a 'shade-cane' reason; ${call('wilsonInterval', shade, records.length, 0.95)}`,
      from: `${formatCount(shade)} of ${formatCount(records.length)} canes recorded in ${input.season} (cane-diameter and shade-cane records, one cane each)`,
    },
    how: `assessCane({ baseDiameterMm, longestInternodeMm, exposure, colourGood, flat, origin, injured }) on each of ${formatCount(assessed)} cane-diameter records; bands from settings.canes`,
  };
}

interface WeightLookup {
  vine: Map<string, number>;
  row: Map<number, { kg: number; vines: number }>;
}

/** Pruning weights of one season by vine and by row sample: measurements first, then pruning records. */
function pruningWeights(input: BlockReportInput, season: number): WeightLookup {
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

function budLoadSection(input: BlockReportInput, s: ViticultureSettings): BudLoadSection | null {
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
      own !== undefined ? [own, 'record' as const]
      : measured !== undefined ? [measured, 'vine' as const]
      : sample ? [sample.kg / sample.vines, 'row-sample' as const]
      : [null, null];
    const target = weightKg !== null ? balancedPruningBuds(weightKg, formula, 'kg') : (num(o.data.budTarget) ?? null);
    vines.push({
      row: o.row,
      position: o.position,
      kept,
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
  const targets = vines.filter((v) => v.target !== null).map((v) => v.target!);
  const meanTarget = mean(targets);
  const formulaText = `${formula.firstUnitBuds} + ${formula.perAdditionalUnitBuds} per ${formula.unit}`;
  const spacing = input.block.vineSpacingM;
  const keptCheck = checkBudLoad(meanKept, spacing, s);
  const targetCheck = meanTarget === null ? null : checkBudLoad(meanTarget, spacing, s);
  const { minBudsPerFt, maxBudsPerFt } = s.budLoad;
  const over = (c: BudLoadCheck | null) => c !== null && c.reading === 'over';
  const warning =
    over(targetCheck) || over(keptCheck)
      ? `${over(targetCheck) ? `The balanced-pruning target (${formatNumber(meanTarget!)} buds a vine)` : `The buds kept (${formatNumber(meanKept)} a vine)`} come to ${formatNumber((over(targetCheck) ? targetCheck! : keptCheck).budsPerFt)} buds per foot of row, above the ${minBudsPerFt}–${maxBudsPerFt} a foot (${keptCheck.rangePerVine.min}–${keptCheck.rangePerVine.max} a vine at this spacing) that Ohio State's pruning primer gives. Check the prunings' weights and the grape type's formula before pruning to it.`
      : null;
  return {
    vinesRecorded: vines.length,
    meanKept: {
      label: 'Buds kept per vine',
      value: meanKept,
      text: formatNumber(meanKept),
      how: 'pruningCheckBuds({ canesKept, budsOnCanes: canesKept × budsPerCane, renewalSpurs }) per vine, averaged',
      from: `${formatCount(vines.length)} pruning records of ${input.season} (each vine's latest)`,
    },
    withTarget: withTarget.length,
    meanTarget:
      meanTarget === null
        ? null
        : {
            label: 'Balanced-pruning target per vine',
            value: meanTarget,
            text: formatNumber(meanTarget),
            how: `balancedPruningBuds(pruningWeightKg, { firstUnitBuds: ${formula.firstUnitBuds}, perAdditionalUnitBuds: ${formula.perAdditionalUnitBuds}, unit: '${formula.unit}' }, 'kg') per vine, averaged`,
            from: `${formatCount(targets.length)} vines whose prunings were weighed (on the record, as a vine weight or as a row sample) or whose record carried a target; formula ${formulaText}${formula.grapeType ? ` (${formula.grapeType})` : ''}`,
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
      how: `${call('checkBudLoad', Number(meanKept.toFixed(1)), spacing)}: buds per vine ÷ vine spacing, against settings.budLoad ${minBudsPerFt}–${maxBudsPerFt} buds per foot (Ohio State, "2023 Grape Pruning Primer")`,
    },
    how: `budDeviationPercent(kept, target); bands from settings.pruningRecord (common practice, no source)`,
  };
}

interface Unit {
  row: number;
  position: number | null;
  kg: number;
  vines: number;
}

function units(rows: { row: number; position: number | null; kg: number; vines: number }[]): Map<string, Unit> {
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

/**
 * Ravaz pairs a vintage's crop with the wood that grew beside it, weighed at the next winter's
 * pruning: vintage V uses yields of season V and pruning weights of season V + 1. Vines pair with
 * vines and row samples with row samples of the same row.
 */
function ravazFor(input: BlockReportInput, vintage: number, s: ViticultureSettings): RavazSection | null {
  const { grapeType } = formulaFor(input.options, s);
  const range = ravazRangeFor(grapeType, s);
  const read = (index: number) => readRavaz(index, { ravaz: range });
  const yields = units(
    input.measurements.filter((m) => m.kind === 'yield' && m.season === vintage).map((m) => ({ row: m.row, position: m.position, kg: m.weightKg, vines: m.vines })),
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
      how: `${call('ravazIndex', meanYield, meanPruning)} → readRavaz against ${range.underBelow}–${range.overAbove}: ${read(index)}`,
      from: `mean yield and mean pruning weight per vine over ${formatCount(vines)} vines weighed at the ${vintage} harvest and at the ${vintage + 1} winter pruning (${formatCount(paired.length)} vines or row samples)`,
    },
    reading: read(index),
    readings,
    range,
    rangeSource: ravazSource(grapeType),
    note: `Yields of the ${vintage} harvest over the one-year wood weighed at the ${vintage + 1} winter pruning.`,
  };
}

function ravazSource(grapeType: GrapeType | null): string {
  return grapeType === 'concord' || grapeType === 'american'
    ? 'Concord-type grapes: 10–20, balanced near 15 (T. Bates, Cornell LERGP, "Vine Size: Magic Number 15")'
    : `${grapeType ?? 'the block'}: settings.ravaz (vinifera 5–10 by default, Wines & Vines, June 2017: "can range from 5 to 10")`;
}

function harvestSection(input: BlockReportInput, units: UnitSystem): HarvestSection | null {
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
      text: formatWeightKg(perVine, units, 2),
      how: `total weight ÷ vines weighed = ${formatNumber(totalKg, 2)} kg ÷ ${vines}`,
      from: `${formatCount(yields.length)} yield entries of the ${input.season} harvest`,
    },
    clusterWeightG: clusters
      ? {
          label: 'Mean cluster weight',
          value: (countedKg * 1000) / clusters,
          text: `${formatNumber((countedKg * 1000) / clusters, 0)} g`,
          how: `weight ÷ clusters = ${formatNumber(countedKg * 1000, 0)} g ÷ ${clusters}`,
          from: `${formatCount(counted.length)} yield entries that counted clusters`,
        }
      : null,
  };
}

function budInjurySection(input: BlockReportInput, budLoad: BudLoadSection | null, s: ViticultureSettings): BudInjurySection | null {
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
      ? inputValue(input.options.budTarget, Math.round(budLoad.meanTarget.value), `the block's mean balanced-pruning target (${formatNumber(budLoad.meanTarget.value)}), rounded`)
      : budLoad
        ? inputValue(input.options.budTarget, Math.round(budLoad.meanKept.value!), `the block's mean buds kept per vine (${formatNumber(budLoad.meanKept.value!)}), rounded`)
        : inputValue(input.options.budTarget, null, 'no pruning records this season: enter a bud target per vine');
  return {
    samples: samples.length,
    budsCut: cut,
    primariesDead: dead,
    kill: {
      label: 'Primary buds dead',
      value: kill,
      text: formatPercent(kill),
      how: call('primaryBudKillPercent', cut, dead),
      from: `${formatCount(dead)} dead primaries in ${formatCount(cut)} buds cut, ${formatCount(samples.length)} winter bud-injury samples of ${input.season}`,
    },
    target,
    adjusted: adjustForBudInjury(target.value, kill, s),
    limits: { ...s.budInjury },
    byRow: [...byRowMap.values()]
      .sort((a, b) => a.row - b.row)
      .map((r) => ({ ...r, killPercent: primaryBudKillPercent(r.budsCut, r.primariesDead) })),
  };
}

/** Next winter's bud target after winter injury; also run in the browser as the target is edited. */
export function adjustForBudInjury(targetBuds: number | null, killPercent: number, settings: ViticultureSettings = DEFAULT_SETTINGS) {
  if (targetBuds === null) return null;
  return {
    ...budInjuryAdjustment(targetBuds, killPercent, settings),
    how: `${call('budInjuryAdjustment', targetBuds, killPercent)}; no extra buds under ${settings.budInjury.extraFromPercent}% (Cornell NNY 2014), minimal pruning above ${settings.budInjury.minimalAbovePercent}% (Purdue; MSU)`,
  };
}

function replantSection(input: BlockReportInput): ReplantSection {
  const reasons: Record<ReplantSlot['reason'], number> = { missing: 0, dead: 0, 'recorded-missing': 0, 'recorded-dead': 0, flagged: 0 };
  const stock = new Map<string, { clone: string; rootstock: string; vines: number }>();
  const rows = new Map<number, number[]>();
  for (const slot of input.replant) {
    reasons[slot.reason]++;
    const clone = slot.clone ?? input.block.clone ?? 'clone not recorded';
    const rootstock = slot.rootstock ?? input.block.rootstock ?? 'rootstock not recorded';
    const key = `${clone}\u0000${rootstock}`;
    const s = stock.get(key) ?? { clone, rootstock, vines: 0 };
    s.vines++;
    stock.set(key, s);
    (rows.get(slot.row) ?? rows.set(slot.row, []).get(slot.row)!).push(slot.position);
  }
  return {
    total: input.replant.length,
    byStock: [...stock.values()].sort((a, b) => b.vines - a.vines || a.clone.localeCompare(b.clone)),
    byRow: [...rows.entries()].sort((a, b) => a[0] - b[0]).map(([row, positions]) => ({ row, positions: positions.sort((a, b) => a - b) })),
    reasons,
    how: "slots marked missing or dead, slots with a missing or dead vine recorded this season and not closed, and open 'replant' flags; clone and rootstock of the vine last planted in the slot, else the block's",
  };
}

function taskSection(tasks: TaskRow[] | null): TaskSection {
  if (!tasks) return { available: false, open: 0, done: 0, cancelled: 0, list: [] };
  return {
    available: true,
    open: tasks.filter((t) => t.status === 'open').length,
    done: tasks.filter((t) => t.status === 'done').length,
    cancelled: tasks.filter((t) => t.status === 'cancelled').length,
    list: tasks,
  };
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
  return inputValue(entered, Number(pooled.toFixed(1)), `${call('budbreakPercent', retained, pushed)} over every budbreak count of ${input.season}: ${formatCount(counts.length)} vines, ${formatCount(weak)} of them weak`);
}

/** Vines to weigh for a crop estimate, from the CV of vine yields: last season's, else this season's, else the default. */
function cropSampling(input: BlockReportInput, s: ViticultureSettings, bearing: number): CropSampling {
  const perVine = (season: number) =>
    input.measurements.filter((m) => m.kind === 'yield' && m.season === season && m.position !== null && m.vines > 0).map((m) => m.weightKg / m.vines);
  // Fewer than five vines say little about the spread; the default is safer then.
  const MIN_VINES = 5;
  let cvPercent = s.crop.yieldCvPercent;
  let cvSource = `default (settings.crop.yieldCvPercent, ${s.crop.yieldCvPercent}%: from memory; weigh at least ${MIN_VINES} single vines for the block's own)`;
  for (const season of [input.season - 1, input.season]) {
    const yields = perVine(season);
    if (yields.length >= MIN_VINES && yields.some((y) => y > 0)) {
      cvPercent = coefficientOfVariationPercent(yields);
      cvSource = `${call('coefficientOfVariationPercent', `${yields.length} vine yields of ${season}`)}`;
      break;
    }
  }
  const marginPercent = s.crop.sampleMarginPercent;
  const vines = sampleSizeForMean(cvPercent, marginPercent, 0.95, bearing > 0 ? bearing : undefined);
  return {
    vines,
    cvPercent,
    cvSource,
    marginPercent,
    how: `${call('sampleSizeForMean', Number(cvPercent.toFixed(1)), marginPercent, 0.95, bearing)}: (1.96 × CV ÷ ${marginPercent})², Wolpert & Vilas (AJEV, 1992)`,
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
  const target = grapeType === 'concord' || grapeType === 'american' ? RAVAZ_TARGETS.concord : null;
  return {
    pruningKgPerVine,
    lowKgPerVine: cropLoadTargetKg(pruningKgPerVine, Math.max(range.underBelow, Number.EPSILON)),
    highKgPerVine: cropLoadTargetKg(pruningKgPerVine, range.overAbove),
    targetKgPerVine: target === null ? null : cropLoadTargetKg(pruningKgPerVine, target),
    how: `cropLoadTargetKg(${formatNumber(pruningKgPerVine, 3)}, Ravaz ${range.underBelow}–${range.overAbove}${target === null ? '' : `, target ${target}`})`,
    from: `mean pruning weight of ${formatCount(vines)} vines weighed at the ${input.season} winter pruning; Ravaz range for ${ravazSource(grapeType)}`,
  };
}

/** The default estimate inputs of a block, from its records where they exist, else from settings. */
function estimateInputs(input: BlockReportInput, budLoad: BudLoadSection | null, s: ViticultureSettings) {
  const o = input.options;
  const previousHarvest = input.measurements.filter((m) => m.kind === 'yield' && m.season === input.season - 1 && m.clusters !== null && m.clusters > 0);
  const previousClusters = previousHarvest.reduce((a, m) => a + m.clusters!, 0);
  const previousClusterG = previousClusters ? (previousHarvest.reduce((a, m) => a + m.weightKg, 0) * 1000) / previousClusters : null;
  const crop: CropInputs = {
    budsPerVine: budLoad
      ? inputValue(o.budsPerVine, Number(budLoad.meanKept.value!.toFixed(1)), `mean buds kept on ${formatCount(budLoad.vinesRecorded)} pruning records`)
      : inputValue(o.budsPerVine, null, 'no pruning records this season: enter the buds kept per vine'),
    budbreakPercent: cropBudbreak(input, s, o.budbreakPercent),
    clustersPerShoot: inputValue(o.clustersPerShoot, s.crop.clustersPerShoot, 'default (settings.crop.clustersPerShoot, from memory)'),
    clusterWeightG:
      previousClusterG !== null
        ? inputValue(o.clusterWeightG, Math.round(previousClusterG), `mean cluster weight of the ${input.season - 1} harvest samples (${formatCount(previousHarvest.reduce((a, m) => a + m.vines, 0))} vines, ${formatCount(previousClusters)} clusters)`)
        : inputValue(o.clusterWeightG, s.crop.clusterWeightG, 'default (settings.crop.clusterWeightG, from memory)'),
    clustersPerVine: inputValue(o.clustersPerVine, null, 'not counted: built from buds × budbreak × clusters per shoot'),
    lagClusterWeightG: inputValue(
      o.lagClusterWeightG,
      null,
      `not weighed: enter clusters weighed at lag phase to use × ${s.crop.lagPhaseMultiplier} (settings.crop.lagPhaseMultiplier; University of Maryland Extension, "cluster weights will double from lag phase to harvest")`,
    ),
  };
  const system = input.block.trainingSystem;
  const labour: LabourInputs = {
    minutesPerVine: inputValue(
      o.minutesPerVine,
      defaultMinutesPerVine(system, s),
      system === 'spur'
        ? 'default for spur pruning (settings.labour.spurMinutesPerVine)'
        : `default for cane pruning (settings.labour.caneMinutesPerVine)${system === 'other' ? ', the slower kind, for an unlisted system' : ''}`,
    ),
    hourlyCost: inputValue(o.hourlyCost, s.labour.hourlyCost, 'placeholder (settings.labour.hourlyCost): enter your crew rate'),
  };
  return { crop, labour };
}

export function buildBlockReport(input: BlockReportInput): BlockReport {
  const s = input.settings ?? DEFAULT_SETTINGS;
  const { block, slots } = input;
  const total = slots.planted + slots.replant + slots.missing + slots.dead;
  const areaM2 = total * block.rowSpacingM * block.vineSpacingM;
  const standing = slots.planted + slots.replant;
  const bearing = slots.planted + slots.bearingReplants;
  const incidence = incidenceSection(input);
  const budbreak = budbreakSection(input, s);
  const budLoad = budLoadSection(input, s);
  const inputs = estimateInputs(input, budLoad, s);
  const cropBasis: CropBasis = {
    lagPhaseMultiplier: s.crop.lagPhaseMultiplier,
    vines: bearing,
    vinesSource: `${formatCount(slots.planted)} planted slots + ${formatCount(slots.bearingReplants)} replants planted in ${input.season - s.crop.bearingAfterSeasons} or before (settings.crop.bearingAfterSeasons)`,
    areaM2,
  };
  const labourBasis: LabourBasis = { vines: standing, trainingSystem: block.trainingSystem, areaM2 };
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
      vinesScouted: incidence.vinesScouted,
      observations: input.observations,
      coverage: {
        label: 'Vines scouted',
        value: coverage ? incidence.vinesScouted / coverage : null,
        text: coverage ? `${formatCount(incidence.vinesScouted)} of ${formatCount(coverage)} standing vines (${formatShare(incidence.vinesScouted / coverage)})` : '–',
        how: 'distinct vines with any live record in the season (missing-vine records aside) ÷ standing vines (planted + replant slots)',
        from: `${formatCount(input.observations)} live records of ${input.season}`,
      },
    },
    incidence: { kinds: incidence.kinds, rows: incidence.rows, slots: incidence.slots },
    budbreak,
    canes: caneSection(input, s),
    budLoad,
    ravaz,
    ravazNote: current
      ? `The ${input.season} vintage, with the prunings weighed at the ${input.season + 1} winter pruning.`
      : ravaz
        ? `The ${input.season} vintage needs the prunings weighed at the ${input.season + 1} winter pruning; shown is the ${input.season - 1} vintage.`
        : `No vine or row sample has both a yield (${input.season - 1} or ${input.season} harvest) and the next winter's pruning weight. Enter weights under "Yields and pruning weights".`,
    harvest: harvestSection(input, input.units),
    crop: {
      basis: cropBasis,
      inputs: inputs.crop,
      estimate: cropEstimate(cropBasis, inputs.crop),
      restsOn: cropRestsOn(inputs.crop),
      sampling: cropSampling(input, s, bearing),
      target: cropLoadTarget(input, s),
    },
    labour: { basis: labourBasis, inputs: inputs.labour, estimate: labourEstimate(labourBasis, inputs.labour, s), recorded: input.recordedLabour ?? null },
    budInjury: budInjurySection(input, budLoad, s),
    tasks: taskSection(input.tasks),
    replant: replantSection(input),
  };
}
