/**
 * Year over year: the same block's figures for two seasons side by side, and the vines whose
 * problems persisted (the same kind at "watch" or worse in both seasons).
 */
import type { BlockReport, PersistedVine } from './block-report';
import { isFindingKind, kindLabel } from '@/lib/labels';
import { formatNumber, formatShare, formatWeightKg } from './format';

export interface CompareRow {
  label: string;
  before: number | null;
  now: number | null;
  /** How both values read, e.g. "12.5%". */
  beforeText: string;
  nowText: string;
  /** Which direction is better, for the arrow words; null when neither is. */
  better: 'lower' | 'higher' | null;
}

export interface Comparison {
  season: number;
  previous: number;
  rows: CompareRow[];
  kinds: { kind: string; label: string; before: number | null; now: number | null }[];
  persisted: { total: number; byKind: { kind: string; label: string; vines: number }[]; vines: PersistedVine[]; shown: number };
}

const share = (v: number | null | undefined) => (v === null || v === undefined ? '–' : formatShare(v));
const plain = (v: number | null | undefined, digits = 1) => (v === null || v === undefined ? '–' : formatNumber(v, digits));

export function compareReports(
  now: BlockReport,
  before: BlockReport,
  persisted: { total: number; byKind: { kind: string; vines: number }[]; vines: PersistedVine[] },
): Comparison {
  const kg = (v: number | null | undefined) => (v === null || v === undefined ? '–' : formatWeightKg(v, now.units));
  const row = (
    label: string,
    b: number | null | undefined,
    n: number | null | undefined,
    text: (v: number | null | undefined) => string,
    better: CompareRow['better'],
  ): CompareRow => ({
    label,
    before: b ?? null,
    now: n ?? null,
    beforeText: text(b),
    nowText: text(n),
    better,
  });
  const rows: CompareRow[] = [
    row('Vines scouted', before.scouting.vinesScouted, now.scouting.vinesScouted, (v) => plain(v, 0), null),
    row('Budbreak over vines checked', before.budbreak?.pooled.value, now.budbreak?.pooled.value, (v) => (v == null ? '–' : `${formatNumber(v)}%`), 'higher'),
    row('Share of weak vines', before.budbreak?.weakShare.estimate, now.budbreak?.weakShare.estimate, share, 'lower'),
    row('Mean cane diameter (mm)', before.canes?.meanDiameterMm, now.canes?.meanDiameterMm, (v) => plain(v), null),
    row('Shade-cane share', before.canes?.shadeShare.estimate, now.canes?.shadeShare.estimate, share, 'lower'),
    row('Buds kept per vine', before.budLoad?.meanKept.value, now.budLoad?.meanKept.value, (v) => plain(v), null),
    row('Balanced-pruning target', before.budLoad?.meanTarget?.value, now.budLoad?.meanTarget?.value, (v) => plain(v), null),
    row('Primary buds dead', before.budInjury?.kill.value, now.budInjury?.kill.value, (v) => (v == null ? '–' : `${formatNumber(v)}%`), 'lower'),
    row('Harvest per vine weighed', before.harvest?.kgPerVine.value, now.harvest?.kgPerVine.value, kg, null),
    row('Crop estimate', before.crop.estimate.kg, now.crop.estimate.kg, kg, null),
    row('Vines to replant', before.replant.total, now.replant.total, (v) => plain(v, 0), 'lower'),
  ];
  const kinds = new Map<string, { kind: string; label: string; before: number | null; now: number | null }>();
  for (const k of before.incidence.kinds) kinds.set(k.kind, { kind: k.kind, label: k.label, before: k.incidence.estimate, now: null });
  for (const k of now.incidence.kinds) {
    const entry = kinds.get(k.kind) ?? { kind: k.kind, label: k.label, before: null, now: null };
    entry.now = k.incidence.estimate;
    kinds.set(k.kind, entry);
  }
  return {
    season: now.season,
    previous: before.season,
    rows,
    kinds: [...kinds.values()].sort((a, b) => (b.now ?? 0) - (a.now ?? 0) || a.label.localeCompare(b.label)),
    persisted: problemsOnly(persisted),
  };
}

/** Persisting problems are findings: a pruner off target two winters running is not a vine's problem. */
function problemsOnly(persisted: { byKind: { kind: string; vines: number }[]; vines: PersistedVine[] }): Comparison['persisted'] {
  const byKind = persisted.byKind.filter((k) => isFindingKind(k.kind)).map((k) => ({ ...k, label: kindLabel(k.kind) }));
  const vines = persisted.vines.filter((v) => isFindingKind(v.kind));
  return { total: byKind.reduce((a, k) => a + k.vines, 0), byKind, vines, shown: vines.length };
}
