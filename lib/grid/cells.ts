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

/**
 * How many vines have each kind at "watch" or worse: entry i counts the vines with bit i + 1 set.
 * Counted bit by bit, not by combination, since a block of 22,500 vines is read on every request.
 */
export function vinesPerKind(rows: readonly RawGridRow[], kinds: number): number[] {
  const vines = new Array<number>(kinds).fill(0);
  for (const row of rows) {
    const packed = row[6];
    if (!packed) continue;
    for (let i = 0; i < packed.length; i++) {
      // Bit 0 stands for a kind GRID_KINDS does not know, which no count asks for.
      for (let bits = (packed[i]! % 65536) >>> 1, kind = 0; bits; bits >>>= 1, kind++) if (bits & 1) vines[kind]!++;
    }
  }
  return vines;
}

/** Counts by kind and severity, and vines affected per kind (vinesPerKind). */
export function kindCounts(kinds: readonly string[], counts: [string, number, number][], vines: readonly number[]) {
  const byKind = new Map<string, [number, number, number, number]>();
  for (const [kind, severity, n] of counts) {
    const row = byKind.get(kind) ?? [0, 0, 0, 0];
    row[severity] = (row[severity] ?? 0) + n;
    byKind.set(kind, row);
  }
  return [...byKind.keys()].sort().map((kind) => {
    const at = kinds.indexOf(kind);
    return { kind: kind as ObservationKind, bySeverity: byKind.get(kind)!, vinesAffected: at < 0 ? 0 : (vines[at] ?? 0) };
  });
}
