/** Words for the grid and the photo log: kinds, severities, slots and one-line readings of data. */
import type { Level, Slot } from '@/lib/grid/cells';
import { formatAddress } from '@/lib/address';
import { formatLengthMm, type UnitSystem } from '@/lib/units';
import { SEVERITY_LABELS } from '@/lib/labels';
import { budbreakPercent, kgToLb, primaryBudKillPercent } from '@/lib/viticulture';

export { kindLabel, SEVERITY_LABELS } from '@/lib/labels';

export const levelLabel = (level: Level) => (level === null ? 'Nothing recorded' : SEVERITY_LABELS[level]);

export const SLOT_LABELS: Record<Slot, string> = {
  planted: 'Planted',
  replant: 'Replant',
  missing: 'Missing',
  dead: 'Dead',
  none: 'No slot',
};

const length = (mm: number, units: UnitSystem) => formatLengthMm(mm, units);

const words = (value: unknown) => String(value ?? 'unknown').replace(/-/g, ' ');
const num = (value: unknown) => (typeof value === 'number' && Number.isFinite(value) ? value : undefined);

/** A short reading of an observation's data, e.g. "15 of 28 buds pushed (54%)". */
export function describeData(kind: string, data: Record<string, unknown>, units: UnitSystem = 'metric'): string {
  const parts: string[] = [];
  switch (kind) {
    case 'cane-diameter':
    case 'shade-cane': {
      const diameter = num(data.diameterMm);
      const internode = num(data.longestInternodeMm);
      if (diameter !== undefined) parts.push(`${length(diameter, units)} at the base`);
      if (internode !== undefined) parts.push(`longest internode ${length(internode, units)}`);
      if (data.exposure) parts.push(`grew in ${data.exposure === 'partial' ? 'part shade' : words(data.exposure)}`);
      if (data.colourGood === false) parts.push('poor colour');
      if (data.flat === true) parts.push('flat');
      if (data.origin && data.origin !== 'two-year-wood') parts.push(`from ${words(data.origin)}`);
      if (data.injured === true) parts.push('injured');
      break;
    }
    case 'weak-budbreak': {
      const retained = num(data.budsRetained);
      const pushed = num(data.budsPushed);
      if (retained && pushed !== undefined && pushed <= retained) {
        parts.push(`${pushed} of ${retained} buds pushed (${Math.round(budbreakPercent(retained, pushed))}%)`);
      }
      break;
    }
    case 'trunk-injury':
      parts.push(`${words(data.cause)}, ${words(data.severity)}`);
      if (num(data.girdlingPercent) !== undefined) parts.push(`${num(data.girdlingPercent)}% girdled`);
      break;
    case 'cane-injury':
      parts.push(`${words(data.cause)}, ${words(data.severity)}, ${num(data.canesAffected) ?? '?'} canes`);
      break;
    case 'missing-vine':
      parts.push(words(data.state));
      break;
    case 'bud-injury': {
      const cut = num(data.budsCut);
      const dead = num(data.primariesDead);
      if (cut && dead !== undefined && dead <= cut) {
        parts.push(`${dead} of ${cut} primary buds dead (${Math.round(primaryBudKillPercent(cut, dead))}%)`);
      }
      break;
    }
    case 'pruning-record': {
      parts.push(`${num(data.canesKept) ?? '?'} canes × ${num(data.budsPerCane) ?? '?'} buds, ${num(data.renewalSpurs) ?? 0} renewal spurs`);
      const weight = num(data.pruningWeightKg);
      if (weight !== undefined) parts.push(`prunings ${units === 'imperial' ? `${kgToLb(weight).toFixed(1)} lb` : `${weight} kg`}`);
      if (num(data.budTarget) !== undefined) parts.push(`target ${num(data.budTarget)} buds`);
      break;
    }
    case 'pruning-check':
      parts.push(`${num(data.canesKept) ?? '?'} canes with ${num(data.budsOnCanes) ?? '?'} buds, ${num(data.renewalSpurs) ?? 0} renewal spurs`);
      if (num(data.budTarget) !== undefined) parts.push(`target ${num(data.budTarget)} buds`);
      break;
  }
  return parts.join('; ');
}

/** "Row 14, post 6, vine 3" when the block counts posts, else "Row 14, vine 28": the address crews use. */
export function vineAddress(row: number, position: number, vinesPerPanel?: number | null) {
  const text = formatAddress(row, position, vinesPerPanel);
  return text.charAt(0).toUpperCase() + text.slice(1);
}

export function formatDay(iso: string | Date) {
  const date = typeof iso === 'string' ? new Date(iso) : iso;
  return date.toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
}
