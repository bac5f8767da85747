import Papa from 'papaparse';
import { z } from 'zod';
import { UNIT_SYSTEMS } from '@/lib/units';

export const TRAINING_SYSTEMS = ['cane', 'spur', 'other'] as const;
export const ROW_ORDERS = ['ascending', 'descending'] as const;
export const SLOT_STATUSES = ['planted', 'missing', 'dead', 'replant'] as const;
export type TrainingSystem = (typeof TRAINING_SYSTEMS)[number];
export type SlotStatus = (typeof SLOT_STATUSES)[number];

/** Hard limits on a block's layout; bigger than any real block, small enough to stay fast. */
export const LAYOUT_LIMITS = { maxRows: 1000, maxVinesPerRow: 1000, maxCsvBytes: 2 * 1024 * 1024 } as const;

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Keep it under ${max} characters`)
    .nullish()
    .transform((v) => v || null);

const optionalWhole = (label: string, min: number, max: number) =>
  z
    .number(`Enter ${label} as a whole number, or leave it empty`)
    .int(`Enter ${label} as a whole number`)
    .min(min, `${label[0]!.toUpperCase()}${label.slice(1)} must be between ${min} and ${max}`)
    .max(max, `${label[0]!.toUpperCase()}${label.slice(1)} must be between ${min} and ${max}`)
    .nullish()
    .transform((v) => v ?? null);

const whole = (message: string, min: number, max: number, range: string) => z.number(message).int(message).min(min, range).max(max, range);

// Spacings are stored to the millimetre; the forms convert what was typed to metres first.
const spacing = (label: string, min: number, max: number, range: string) =>
  z
    .number(`Enter the ${label}`)
    .min(min, range)
    .max(max, range)
    .transform((v) => Math.round(v * 1000) / 1000);

export const yearSchema = (label: string) => whole(`Enter the ${label} as a year, e.g. 2019`, 1850, 2100, `The ${label} must be between 1850 and 2100`);

export const blockSchema = z.object({
  name: z.string().trim().min(1, 'Give the block a name').max(80, 'Keep the name under 80 characters'),
  variety: z.string().trim().min(1, 'Enter the variety').max(80, 'Keep the variety under 80 characters'),
  clone: optionalText(60),
  rootstock: optionalText(60),
  plantingYear: yearSchema('planting year')
    .nullish()
    .transform((v) => v ?? null),
  trainingSystem: z.enum(TRAINING_SYSTEMS, 'Choose cane, spur or other'),
  rowSpacingM: spacing('row spacing', 0.5, 15, 'Row spacing must be between 0.5 m (1 ft 8 in) and 15 m (49 ft)'),
  vineSpacingM: spacing('vine spacing', 0.2, 15, 'Vine spacing must be between 0.2 m (8 in) and 15 m (49 ft)'),
  rowCount: whole('Enter the number of rows', 1, LAYOUT_LIMITS.maxRows, `A block has between 1 and ${LAYOUT_LIMITS.maxRows} rows`),
  vinesPerRow: whole(
    'Enter the usual number of vines per row',
    1,
    LAYOUT_LIMITS.maxVinesPerRow,
    `A row has between 1 and ${LAYOUT_LIMITS.maxVinesPerRow} vines`,
  ),
  vinesPerPanel: optionalWhole('vines per panel', 1, 50),
  firstRow: whole('Enter the number of the first row', 1, 9999, 'The first row must be between 1 and 9999'),
  rowOrder: z.enum(ROW_ORDERS, 'Choose which way the row numbers run'),
  positionOrigin: optionalText(120),
  rowBearingDeg: optionalWhole('row bearing', 0, 359),
  notes: optionalText(2000),
});

export type BlockInput = z.output<typeof blockSchema>;
export type BlockFormValues = z.input<typeof blockSchema>;

/** PATCH: any subset of the block's fields; the service merges it over the stored block. */
export const blockPatchSchema = blockSchema.partial();

export const rowVineCountSchema = z.object({
  vineCount: whole('Enter the number of vines in this row', 1, LAYOUT_LIMITS.maxVinesPerRow, `A row has between 1 and ${LAYOUT_LIMITS.maxVinesPerRow} vines`),
});

/**
 * A slot's new status. Missing and dead close the vine that stood there (in `year`, this year when
 * left out); a replant closes it too and plants a new vine of that year, clone and rootstock (the
 * block's when left out), so the slot keeps the history of every vine that stood in it.
 */
export const slotStatusSchema = z
  .object({
    status: z.enum(SLOT_STATUSES, 'Choose planted, missing, dead or replant'),
    year: yearSchema('year')
      .nullish()
      .transform((v) => v ?? null),
    clone: optionalText(60),
    rootstock: optionalText(60),
  })
  .refine((v) => v.status !== 'replant' || v.year !== null, { path: ['year'], message: 'Enter the year of the replant' });

export type SlotStatusInput = z.output<typeof slotStatusSchema>;

export const unitPreferenceSchema = z.object({ unitSystem: z.enum(UNIT_SYSTEMS, 'Choose metric or imperial') });

/*
 * Layout CSV, for import and export:
 *
 *   row,vines,statuses
 *   1,60,PPPPPMPPPP…
 *   2,58,
 *
 * One line per row of the block, in any order. `row` is the row number and `vines` the number of
 * planting slots in it. `statuses` is optional (the whole column may be left out): one letter per
 * slot, from vine 1 on: P planted, M missing, D dead, R replant (a new replant takes this year).
 * Left empty, the row's existing slots keep their statuses and new slots are planted.
 * The file describes the whole block: rows must run from the block's first row without gaps;
 * rows the file leaves out are removed, as are slots beyond a row's new vine count.
 */
export const STATUS_LETTERS: Record<string, SlotStatus> = { P: 'planted', M: 'missing', D: 'dead', R: 'replant' };
export const LETTER_OF: Record<SlotStatus, string> = { planted: 'P', missing: 'M', dead: 'D', replant: 'R' };

export interface LayoutCsvRow {
  row: number;
  vines: number;
  /** One letter per slot, upper-case, or null to keep the row's statuses. */
  statuses: string | null;
  line: number;
}

export interface LayoutProblem {
  /** 1-based line of the file, or null for a problem with the file as a whole. */
  line: number | null;
  message: string;
}

export type LayoutCsvResult =
  | { ok: true; rows: LayoutCsvRow[] }
  /** At most 50 problems are listed; `total` counts them all. */
  | { ok: false; tooLarge: boolean; problems: LayoutProblem[]; total: number };

const MAX_PROBLEMS = 50;

function show(value: string) {
  return value.length > 20 ? `"${value.slice(0, 20)}…"` : `"${value}"`;
}

/** Parses and checks a layout CSV against the block's first row. Nothing here touches the database. */
export function parseLayoutCsv(text: string, firstRow: number): LayoutCsvResult {
  const problems: LayoutProblem[] = [];
  const fail = (tooLarge = false): LayoutCsvResult => ({ ok: false, tooLarge, problems: problems.slice(0, MAX_PROBLEMS), total: problems.length });
  const clean = text.replace(/^\uFEFF/, '');
  if (!clean.trim()) {
    problems.push({ line: null, message: 'The file is empty. A layout file starts with the header row,vines,statuses and has one line per row.' });
    return fail();
  }
  const parsed = Papa.parse<string[]>(clean, { header: false, skipEmptyLines: false, delimiter: ',' });
  for (const e of parsed.errors) {
    problems.push({ line: e.row === undefined ? null : e.row + 1, message: `The file is not valid CSV: ${e.message}` });
  }
  if (problems.length) return fail();
  const lines = parsed.data;
  const headerIndex = lines.findIndex((cells) => cells.some((c) => c.trim() !== ''));
  const header = lines[headerIndex]!.map((c) => c.trim().toLowerCase());
  const withStatuses = header.length === 3 && header[2] === 'statuses';
  if (!(header[0] === 'row' && header[1] === 'vines' && (header.length === 2 || withStatuses))) {
    problems.push({
      line: headerIndex + 1,
      message: `The first line must be the header row,vines,statuses (statuses may be left out), but it is ${show(lines[headerIndex]!.join(','))}.`,
    });
    return fail();
  }
  const seen = new Map<number, number>();
  const rows: LayoutCsvRow[] = [];
  const width = header.length;
  for (let i = headerIndex + 1; i < lines.length; i++) {
    const cells = lines[i]!.map((c) => c.trim());
    const line = i + 1;
    if (cells.every((c) => c === '')) continue;
    if (rows.length + problems.length >= LAYOUT_LIMITS.maxRows) {
      problems.length = 0;
      problems.push({
        line,
        message: `The file has more than ${LAYOUT_LIMITS.maxRows.toLocaleString('en-US')} rows; a block can have at most ${LAYOUT_LIMITS.maxRows.toLocaleString('en-US')}. Nothing was changed.`,
      });
      return fail(true);
    }
    if (cells.length > width) {
      problems.push({ line, message: `Line ${line} has ${cells.length} values; expected ${width} (${header.join(',')}).` });
      continue;
    }
    const [rowText = '', vinesText = '', statusText = ''] = cells;
    const lineProblems: string[] = [];
    const row = /^\d+$/.test(rowText) ? Number(rowText) : NaN;
    if (!rowText) lineProblems.push('the row number is missing');
    else if (!Number.isSafeInteger(row) || row < 1) lineProblems.push(`row ${show(rowText)} is not a row number (a whole number from 1)`);
    else if (row < firstRow) lineProblems.push(`row ${row} comes before the block's first row (${firstRow})`);
    else if (seen.has(row)) lineProblems.push(`row ${row} is listed twice (also on line ${seen.get(row)})`);
    const vines = /^\d+$/.test(vinesText) ? Number(vinesText) : NaN;
    if (!vinesText) lineProblems.push('the number of vines is missing');
    else if (!Number.isSafeInteger(vines)) lineProblems.push(`vines ${show(vinesText)} is not a whole number`);
    else if (vines < 1) lineProblems.push('a row needs at least 1 vine');
    else if (vines > LAYOUT_LIMITS.maxVinesPerRow) {
      problems.length = 0;
      problems.push({
        line,
        message: `Line ${line}: row ${rowText} has ${vines.toLocaleString('en-US')} vines; a row can have at most ${LAYOUT_LIMITS.maxVinesPerRow.toLocaleString('en-US')}. Nothing was changed.`,
      });
      return fail(true);
    }
    let statuses: string | null = null;
    if (statusText) {
      statuses = statusText.toUpperCase();
      const bad = [...statuses].findIndex((c) => !(c in STATUS_LETTERS));
      if (bad >= 0) lineProblems.push(`statuses may only use the letters P, M, D and R, but vine ${bad + 1} is ${show(statusText[bad]!)}`);
      else if (Number.isSafeInteger(vines) && statuses.length !== vines) {
        lineProblems.push(`there are ${statuses.length} statuses for ${vines} vines; give one letter per vine or leave statuses empty`);
      }
    }
    if (Number.isSafeInteger(row) && row >= 1 && !seen.has(row)) seen.set(row, line);
    if (lineProblems.length) {
      problems.push({ line, message: `Line ${line}: ${lineProblems.join('; ')}.` });
      continue;
    }
    rows.push({ row, vines, statuses, line });
  }
  if (problems.length) return fail();
  if (rows.length === 0) {
    problems.push({ line: null, message: 'The file has a header but no rows; a block needs at least one row.' });
    return fail();
  }
  const lastRow = firstRow + rows.length - 1;
  const gaps: number[] = [];
  for (let r = firstRow; r <= lastRow && gaps.length < 10; r++) if (!seen.has(r)) gaps.push(r);
  if (gaps.length) {
    problems.push({
      line: null,
      message: `Rows must run from the block's first row (${firstRow}) without gaps, but row ${gaps.join(', ')} ${gaps.length === 1 ? 'is' : 'are'} missing.`,
    });
    return fail();
  }
  return { ok: true, rows: rows.sort((a, b) => a.row - b.row) };
}

/** The same format back: a file that imports into no change. */
export function formatLayoutCsv(rows: { row: number; vines: number; statuses: string }[]): string {
  return `row,vines,statuses\n${rows.map((r) => `${r.row},${r.vines},${r.statuses}`).join('\n')}\n`;
}
