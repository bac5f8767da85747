/**
 * One grid cell per planting slot as a small integer, code = slot × 5 + level, sent as one letter
 * (packRow) so a 150 × 150 block travels as 150 strings of 150 letters. The SQL in
 * lib/server/queries/grid.ts builds the same codes.
 */
import { OBSERVATION_KINDS, type ObservationKind, type Severity } from '@/lib/viticulture';

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

// 'A' for code 0 up to 'Y' for the highest (24): letters JSON sends as they are. Half the bytes of
// comma-separated numbers, so half the server's gzip time on every grid answer (2.3 ms against 4.6
// ms for a bench block of 22,500 vines).
const LETTER_A = 65;

/** A row of cell codes as the grid answer carries it: one letter per vine. */
export function packRow(codes: readonly number[]): string {
  return String.fromCharCode(...codes.map((code) => code + LETTER_A));
}

/** The cell codes of a row as packRow wrote it. */
export function unpackRow(text: string): number[] {
  const codes = new Array<number>(text.length);
  for (let i = 0; i < text.length; i++) codes[i] = text.charCodeAt(i) - LETTER_A;
  return codes;
}

/** A slot with no vine standing in it: its findings matter less than the hole itself. */
export const isEmptySlot = (slot: Slot) => slot === 'missing' || slot === 'dead';

/** The kinds in the order the grid statement numbers them (bit i + 1 of a vine's kind mask is kind i). */
export const GRID_KINDS: readonly string[] = OBSERVATION_KINDS;

/**
 * One row as the grid statement returns it: row number, vine count, slots not planted (position × 4 +
 * slot index), the positions present when the row has gaps, vines with matching findings (position ×
 * 4 + worst severity), the last position present, vines with kinds at "watch" or worse (position ×
 * 65536 + kind bits), and how many vines have any record in scope but a missing-vine one. Each
 * packs its position, so the lists come in no set order: sorting each of them in SQL cost a block of
 * 22,500 vines about a quarter of the statement.
 */
export type RawGridRow = [number, number, number[] | null, number[] | null, number[] | null, number, number[] | null, number];

const PLANTED = encodeCell('planted', null);
const NO_SLOT = encodeCell('none', null);

/** A row's cell codes, vine 1 first. */
export function rowCodes([, vineCount, slots, present, worst, last]: RawGridRow): number[] {
  const codes = new Array<number>(Math.max(vineCount, last)).fill(NO_SLOT);
  if (present) for (const p of present) codes[p - 1] = PLANTED;
  else codes.fill(PLANTED, 0, last);
  if (slots) for (const packed of slots) codes[(packed >> 2) - 1] = (packed & 3) * LEVELS_PER_SLOT;
  for (const packed of worst ?? []) {
    const p = packed >> 2;
    if (p <= codes.length) codes[p - 1]! += (packed & 3) + 1;
  }
  return codes;
}

/** How many vines share each combination of kind bits. */
export function kindMasks(rows: readonly RawGridRow[]): [number, number][] {
  const tally = new Map<number, number>();
  for (const row of rows) {
    for (const packed of row[6] ?? []) {
      const mask = packed % 65536;
      tally.set(mask, (tally.get(mask) ?? 0) + 1);
    }
  }
  return [...tally];
}

/** Counts by kind and severity, and vines affected per kind from the vines' kind masks. */
export function kindCounts(kinds: readonly string[], counts: [string, number, number][], masks: [number, number][]) {
  const byKind = new Map<string, [number, number, number, number]>();
  for (const [kind, severity, n] of counts) {
    const row = byKind.get(kind) ?? [0, 0, 0, 0];
    row[severity] = (row[severity] ?? 0) + n;
    byKind.set(kind, row);
  }
  return [...byKind.keys()].sort().map((kind) => {
    const bit = 1 << (kinds.indexOf(kind) + 1);
    const vinesAffected = kinds.includes(kind) ? masks.reduce((sum, [mask, vines]) => (mask & bit ? sum + vines : sum), 0) : 0;
    return { kind: kind as ObservationKind, bySeverity: byKind.get(kind)!, vinesAffected };
  });
}
