/**
 * The observation export: one CSV line per live observation, with a fixed column set that only
 * ever grows at the end, so spreadsheets and scripts built on it keep working.
 *
 * Columns, in order:
 *   observation_id        the record's id (UUID, made on the device)
 *   season                season of observed_at (the calendar year, UTC, unless the estate's
 *                         seasons start in another month; lib/reports/season.ts)
 *   block_id, block_name  the block
 *   row, position         the vine's planting slot
 *   kind                  cane-diameter | shade-cane | weak-budbreak | trunk-injury | cane-injury |
 *                         missing-vine | bud-injury | pruning-record | pruning-check | note
 *   severity              0 fine, 1 watch, 2 act this season, 3 act now (lib/viticulture)
 *   status                open | closed
 *   observed_at           ISO 8601, UTC
 *   closed_at             ISO 8601, UTC, or empty
 *   recorded_by           the person's name, else e-mail, or empty
 *   note                  free text as typed (quoted when it holds a comma, quote or line break)
 *   diameter_mm, longest_internode_mm, exposure             canes
 *   buds_retained, buds_pushed, budbreak_percent            budbreak (budbreakPercent)
 *   buds_cut, primaries_dead, primary_kill_percent          winter bud injury (primaryBudKillPercent)
 *   canes_kept, buds_per_cane, renewal_spurs, pruning_weight_kg, bud_target   pruning records
 *   data_json             every field the device sent, as JSON
 * Numbers use a point for decimals; empty means "not recorded". Text cells that start with = + - @
 * get a leading apostrophe so a spreadsheet never runs them as formulas.
 */
import { budbreakPercent, primaryBudKillPercent } from '@/lib/viticulture';
import { seasonOf } from './season';

export const CSV_COLUMNS = [
  'observation_id',
  'season',
  'block_id',
  'block_name',
  'row',
  'position',
  'kind',
  'severity',
  'status',
  'observed_at',
  'closed_at',
  'recorded_by',
  'note',
  'diameter_mm',
  'longest_internode_mm',
  'exposure',
  'buds_retained',
  'buds_pushed',
  'budbreak_percent',
  'buds_cut',
  'primaries_dead',
  'primary_kill_percent',
  'canes_kept',
  'buds_per_cane',
  'renewal_spurs',
  'pruning_weight_kg',
  'bud_target',
  'data_json',
] as const;

export const CSV_COLUMN_NOTES: Record<(typeof CSV_COLUMNS)[number], string> = {
  observation_id: "The record's id (UUID, made on the device).",
  season: 'Season of observed_at: its calendar year in UTC, or, when the estate’s seasons start later in the year, the year the season ends in.',
  block_id: "The block's id.",
  block_name: "The block's name.",
  row: 'Row number.',
  position: 'Planting slot in the row, counted from the block’s agreed row end.',
  kind: 'Observation kind (cane-diameter, shade-cane, weak-budbreak, trunk-injury, cane-injury, missing-vine, bud-injury, pruning-record, pruning-check, note).',
  severity: '0 fine, 1 watch, 2 act this season, 3 act now.',
  status: 'open or closed.',
  observed_at: 'When it was observed, ISO 8601 in UTC.',
  closed_at: 'When it was closed, ISO 8601 in UTC; empty while open.',
  recorded_by: 'Who recorded it (name, else e-mail).',
  note: 'Free text as typed.',
  diameter_mm: 'Cane base diameter, mm.',
  longest_internode_mm: 'Longest internode of the cane, mm.',
  exposure: 'Where the cane grew: sun, partial or shade.',
  buds_retained: 'Buds left at pruning (budbreak check).',
  buds_pushed: 'Buds that pushed a shoot.',
  budbreak_percent: 'budbreakPercent(buds_retained, buds_pushed).',
  buds_cut: 'Buds cut open (winter bud-injury sample).',
  primaries_dead: 'Dead primary buds among them.',
  primary_kill_percent: 'primaryBudKillPercent(buds_cut, primaries_dead).',
  canes_kept: 'Fruit canes (or spurs) kept at pruning.',
  buds_per_cane: 'Buds per kept cane (pruning record).',
  renewal_spurs: 'Renewal spurs kept.',
  pruning_weight_kg: 'One-year prunings of the vine, kg (pruning record).',
  bud_target: 'The bud target the record was pruned to.',
  data_json: 'Every data field of the record, as JSON.',
};

export interface ExportRow {
  id: string;
  blockId: string;
  blockName: string;
  row: number;
  position: number;
  kind: string;
  severity: number;
  status: string;
  observedAt: Date | string;
  closedAt: Date | string | null;
  recordedBy: string | null;
  note: string;
  data: Record<string, unknown>;
}

/** One cell: quoted when it holds a comma, a quote or a line break; quotes doubled. */
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  let text = typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : String(value);
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export const csvHeader = () => `${CSV_COLUMNS.join(',')}\r\n`;

const iso = (v: Date | string | null) => (v === null ? null : (typeof v === 'string' ? new Date(v) : v).toISOString());
const n = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);

function safe<T>(fn: () => T): T | undefined {
  try {
    return fn();
  } catch {
    // A stored record the calculation refuses (more pushed than retained) exports its raw fields only.
    return undefined;
  }
}

export function csvLine(r: ExportRow, seasonStartMonth = 1): string {
  const d = r.data ?? {};
  const retained = n(d.budsRetained);
  const pushed = n(d.budsPushed);
  const cut = n(d.budsCut);
  const dead = n(d.primariesDead);
  const observedAt = iso(r.observedAt)!;
  const cells: unknown[] = [
    r.id,
    seasonOf(observedAt, seasonStartMonth),
    r.blockId,
    r.blockName,
    r.row,
    r.position,
    r.kind,
    r.severity,
    r.status,
    observedAt,
    iso(r.closedAt),
    r.recordedBy,
    r.note,
    n(d.diameterMm),
    n(d.longestInternodeMm),
    typeof d.exposure === 'string' ? d.exposure : undefined,
    retained,
    pushed,
    r.kind === 'weak-budbreak' && retained !== undefined && pushed !== undefined ? safe(() => round(budbreakPercent(retained, pushed))) : undefined,
    cut,
    dead,
    r.kind === 'bud-injury' && cut !== undefined && dead !== undefined ? safe(() => round(primaryBudKillPercent(cut, dead))) : undefined,
    n(d.canesKept),
    n(d.budsPerCane),
    n(d.renewalSpurs),
    n(d.pruningWeightKg),
    n(d.budTarget),
    JSON.stringify(d),
  ];
  return `${cells.map(csvCell).join(',')}\r\n`;
}

// Two decimals are finer than any count of buds can resolve.
const round = (v: number) => Math.round(v * 100) / 100;
