/**
 * A season is twelve months from the organisation's start month, in UTC: the winter pruning that
 * opens it, the budbreak checks, the harvest and the post-harvest walks before the next pruning.
 * With a January start a season is a calendar year. With a later start (a southern-hemisphere
 * estate prunes in July and picks in March) it spans two calendar years and is named by the year it
 * ends in, its harvest's year: with a July start, season 2026 runs from 1 July 2025 to 30 June 2026.
 * Every report, export and weight is scoped by it, so "2026" means the same records everywhere.
 */

export const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'] as const;

export interface SeasonBounds {
  /** Inclusive. */
  from: string;
  /** Exclusive: the first instant of the next season. */
  to: string;
}

function checkStart(startMonth: number) {
  if (!Number.isInteger(startMonth) || startMonth < 1 || startMonth > 12) throw new RangeError(`the season's start month must be 1–12, got ${startMonth}`);
}

export function seasonBounds(season: number, startMonth = 1): SeasonBounds {
  if (!Number.isInteger(season)) throw new RangeError(`season must be a whole year, got ${season}`);
  checkStart(startMonth);
  const first = startMonth === 1 ? season : season - 1;
  return { from: start(first, startMonth), to: start(first + 1, startMonth) };
}

export function seasonOf(when: string | Date, startMonth = 1): number {
  checkStart(startMonth);
  const at = typeof when === 'string' ? new Date(when) : when;
  const year = at.getUTCFullYear();
  return startMonth > 1 && at.getUTCMonth() + 1 >= startMonth ? year + 1 : year;
}

/**
 * Months to add to a moment (as a UTC date and time) so that its calendar year is its season: SQL
 * finds a record's season as the year of `observed_at + this many months`.
 */
export const seasonShiftMonths = (startMonth: number) => {
  checkStart(startMonth);
  return (13 - startMonth) % 12;
};

/** "2026" for a calendar-year season, "2025–26" for one that spans two years. */
export function seasonLabel(season: number, startMonth = 1): string {
  return startMonth === 1 ? String(season) : `${season - 1}–${String(season % 100).padStart(2, '0')}`;
}

/** The season to show when none was asked for: the latest one with records, else the current one. */
export function defaultSeason(seasons: readonly number[], now: Date, startMonth = 1): number {
  return seasons.length ? Math.max(...seasons) : seasonOf(now, startMonth);
}

function start(year: number, month: number) {
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-01T00:00:00.000Z`;
}
