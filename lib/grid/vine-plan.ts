/**
 * A vine's pruning plan from its latest measurements: the canes measured on the most recent day
 * any were measured (cane-diameter records, and shade-cane records that carry a diameter), and the
 * latest pruning weight from a pruning record. The plan itself is lib/viticulture's planVine.
 */
import {
  checkBudLoad,
  planVine,
  type BudLoadCheck,
  type CaneInput,
  type Exposure,
  type SettingsOverride,
  type VinePlan,
  type WoodOrigin,
} from '@/lib/viticulture';

export interface MeasuredObservation {
  kind: string;
  data: Record<string, unknown>;
  observedAt: string;
}

export interface VinePlanReading {
  plan: VinePlan | null;
  /** Why there is no plan, when there is none. */
  reason: string | null;
  canes: CaneInput[];
  measuredOn: string | null;
  pruningWeightKg: number | null;
  /** The plan's buds per foot of row against Ohio State's 4–6, when the vine spacing is known. */
  budLoad: BudLoadCheck | null;
}

const day = (iso: string) => iso.slice(0, 10);
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : undefined);

function caneFrom(o: MeasuredObservation): CaneInput | null {
  const diameter = num(o.data.diameterMm);
  if (diameter === undefined || (o.kind !== 'cane-diameter' && o.kind !== 'shade-cane')) return null;
  const d = o.data;
  const cane: CaneInput = { baseDiameterMm: diameter };
  if (num(d.longestInternodeMm) !== undefined) cane.longestInternodeMm = num(d.longestInternodeMm);
  if (typeof d.exposure === 'string') cane.exposure = d.exposure as Exposure;
  if (typeof d.colourGood === 'boolean') cane.colourGood = d.colourGood;
  if (typeof d.flat === 'boolean') cane.flat = d.flat;
  if (typeof d.origin === 'string') cane.origin = d.origin as WoodOrigin;
  if (typeof d.injured === 'boolean') cane.injured = d.injured;
  return cane;
}

/**
 * `vineSpacingM`, where known, caps a spur plan at the spurs its cordon holds (a bilateral cordon
 * fills the vine spacing) and reads the plan's buds per foot of row. `settings` are the block's
 * (lib/server/services/settings.ts); left out, the defaults.
 */
export function planFromObservations(
  trainingSystem: string,
  observations: readonly MeasuredObservation[],
  vineSpacingM?: number,
  settings?: SettingsOverride,
): VinePlanReading {
  const measured = observations.map((o) => ({ o, cane: caneFrom(o) })).filter((m): m is { o: MeasuredObservation; cane: CaneInput } => m.cane !== null);
  const latestDay = measured.reduce<string | null>((max, m) => (max === null || day(m.o.observedAt) > max ? day(m.o.observedAt) : max), null);
  const canes = measured
    .filter((m) => day(m.o.observedAt) === latestDay)
    .sort((a, b) => a.o.observedAt.localeCompare(b.o.observedAt))
    .map((m) => m.cane);
  const weighed = observations
    .filter((o) => o.kind === 'pruning-record' && num(o.data.pruningWeightKg) !== undefined)
    .sort((a, b) => b.observedAt.localeCompare(a.observedAt))[0];
  const pruningWeightKg = weighed ? (weighed.data.pruningWeightKg as number) : null;
  const spacing = vineSpacingM !== undefined && Number.isFinite(vineSpacingM) && vineSpacingM > 0 ? vineSpacingM : undefined;
  const base = { canes, measuredOn: latestDay, pruningWeightKg, budLoad: null };

  if (trainingSystem !== 'cane' && trainingSystem !== 'spur') {
    return { ...base, plan: null, reason: 'The block’s training system has no pruning plan.' };
  }
  if (canes.length === 0) return { ...base, plan: null, reason: 'No canes measured on this vine yet.' };
  try {
    const plan = planVine({
      trainingSystem,
      canes,
      ...(pruningWeightKg !== null ? { pruningWeight: pruningWeightKg, weightUnit: 'kg' as const } : {}),
      ...(spacing !== undefined && trainingSystem === 'spur' ? { cordonLengthM: spacing } : {}),
      ...(settings ? { settings } : {}),
    });
    const budLoad = spacing === undefined ? null : checkBudLoad(plan.targetBuds ?? plan.totalBuds, spacing, settings);
    return { ...base, plan, reason: null, budLoad };
  } catch (err) {
    // Stored data passed the sync schema; a RangeError here means a measurement the plan cannot use.
    if (err instanceof RangeError) return { ...base, plan: null, reason: `The measurements cannot be planned from: ${err.message}` };
    throw err;
  }
}
