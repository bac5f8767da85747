/**
 * One grid cell per planting slot, sent as a small integer so a 150 × 150 block travels as 22,500
 * numbers: code = slot × 5 + level. The SQL in lib/server/queries/grid.ts builds the same codes.
 */
import type { Severity } from '@/lib/viticulture';

/** What stands in the slot. `none`: the row is shorter than the block's longest row. */
export const SLOTS = ['planted', 'replant', 'missing', 'dead', 'none'] as const;
export type Slot = (typeof SLOTS)[number];

/** Worst matching finding: nothing recorded, or its severity 0–3. */
export type Level = null | Severity;

export const LEVELS_PER_SLOT = 5;

export function encodeCell(slot: Slot, level: Level): number {
  return SLOTS.indexOf(slot) * LEVELS_PER_SLOT + (level === null ? 0 : level + 1);
}

export function cellSlot(code: number): Slot {
  return SLOTS[Math.floor(code / LEVELS_PER_SLOT)] ?? 'none';
}

export function cellLevel(code: number): Level {
  const level = code % LEVELS_PER_SLOT;
  return level === 0 ? null : ((level - 1) as Severity);
}

/** A slot with no vine standing in it: its findings matter less than the hole itself. */
export const isEmptySlot = (slot: Slot) => slot === 'missing' || slot === 'dead';
