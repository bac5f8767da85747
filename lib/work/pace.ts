/**
 * Pace and projection of one pass over a block: pure arithmetic on what the crews recorded.
 * Pace is vines per person-hour; the finish is projected from the vines done per day worked.
 */

/** Vines per person-hour; null before any hours are recorded. */
export function vinesPerPersonHour(vines: number, personHours: number): number | null {
  if (!(personHours > 0)) return null;
  return vines / personHours;
}

/**
 * Person-hours the whole pass takes at the pace so far: the hours spent plus the vines left at
 * that pace. Null with no pace yet. Repeated work (a row gone over twice) lowers the pace, so it
 * shows in the projection.
 */
export function projectedPersonHours(input: { vinesDone: number; vineCount: number; personHours: number }): number | null {
  const pace = vinesPerPersonHour(input.vinesDone, input.personHours);
  if (pace === null || pace === 0) return null;
  const left = Math.max(0, input.vineCount - input.vinesDone);
  return input.personHours + left / pace;
}

const DAY_MS = 24 * 3600 * 1000;

/**
 * The day the pass ends at the pace so far: vines done per day worked, the vines left at that
 * rate, counted as calendar days after the last day worked (every day is taken as a work day;
 * days off push the real date later). The day the last vine was done once the pass is complete;
 * null before any work. Days are `YYYY-MM-DD` (UTC).
 */
export function projectFinish(input: { vinesDone: number; vineCount: number; workDays: readonly string[] }): string | null {
  const days = [...new Set(input.workDays)].sort();
  const last = days.at(-1);
  if (!last || input.vinesDone <= 0) return null;
  const left = input.vineCount - input.vinesDone;
  if (left <= 0) return last;
  const perDay = input.vinesDone / days.length;
  const more = Math.ceil(left / perDay);
  return new Date(Date.parse(`${last}T00:00:00Z`) + more * DAY_MS).toISOString().slice(0, 10);
}
