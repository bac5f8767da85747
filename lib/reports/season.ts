/**
 * A season is a calendar year in UTC: the winter pruning that opens it, the budbreak checks, the
 * harvest and the post-harvest walks before the next pruning. Every report, export and weight is
 * scoped by it, so "2026" means the same records everywhere.
 */

export interface SeasonBounds {
  /** Inclusive. */
  from: string;
  /** Exclusive: the first instant of the next season. */
  to: string;
}

export function seasonBounds(season: number): SeasonBounds {
  if (!Number.isInteger(season)) throw new RangeError(`season must be a whole year, got ${season}`);
  return { from: `${pad(season)}-01-01T00:00:00.000Z`, to: `${pad(season + 1)}-01-01T00:00:00.000Z` };
}

export function seasonOf(when: string | Date): number {
  return (typeof when === 'string' ? new Date(when) : when).getUTCFullYear();
}

/** The season to show when none was asked for: the latest one with records, else this year. */
export function defaultSeason(seasons: readonly number[], now: Date): number {
  return seasons.length ? Math.max(...seasons) : now.getUTCFullYear();
}

function pad(year: number) {
  return String(year).padStart(4, '0');
}
