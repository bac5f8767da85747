import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { can } from '@/lib/roles';
import type { BlockReportResponse, EstateReportResponse } from '@/lib/reports/api';
import { buildBlockReport, type BlockReport, type BlockReportInput } from '@/lib/reports/block-report';
import { compareReports, type Comparison } from '@/lib/reports/compare';
import { csvHeader, csvLine } from '@/lib/reports/csv';
import { buildEstateReport } from '@/lib/reports/estate-report';
import { defaultSeason, seasonBounds } from '@/lib/reports/season';
import type { Member } from '@/lib/server/auth/guard';
import { db, type Db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { findVineByAddress } from '@/lib/server/queries/grid';
import { getBlock, hasBlockRow, listBlocks, type BlockRow } from '@/lib/server/queries/blocks';
import { deleteMeasurement, getMeasurement, insertMeasurement, listMeasurements } from '@/lib/server/queries/measurements';
import {
  countByRowAndKind,
  countSlots,
  listExportPage,
  listMeasuredObservations,
  listMeasurementRows,
  listPersistedProblems,
  listRecordedPruningWeights,
  listReplantSlots,
  listSeasons,
  listSeasonTasks,
  type ExportCursor,
} from '@/lib/server/queries/reports';
import { loadRecordedLabour } from '@/lib/server/services/row-work';
import { weightKg, type MeasurementInput, type MeasurementView } from '@/lib/validation/measurement';
import type { ReportOptions } from '@/lib/validation/report';
import { findSnapshots, saveSnapshot, type SnapshotLookup } from '@/lib/server/queries/report-snapshots';
import { settingsForBlocks } from '@/lib/server/services/settings';
import type { ViticultureSettings } from '@/lib/viticulture';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function blockOf(database: Db, member: Member, blockId: string): Promise<BlockRow> {
  const block = UUID.test(blockId) ? await getBlock(database, member.organisationId, blockId) : undefined;
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
  return block;
}

async function workOutBlockSeason(
  database: Db,
  member: Member,
  block: BlockRow,
  season: number,
  options: ReportOptions,
  settings: ViticultureSettings,
): Promise<BlockReport> {
  const org = member.organisationId;
  const month = member.seasonStartMonth;
  const period = seasonBounds(season, month);
  const [slots, counts, measured, measurements, recordedWeights, replant, tasks, recordedLabour] = await Promise.all([
    countSlots(database, block.id, season - settings.crop.bearingAfterSeasons),
    countByRowAndKind(database, org, block.id, period),
    listMeasuredObservations(database, org, block.id, period),
    listMeasurementRows(database, org, block.id, season - 1, season + 1, month),
    listRecordedPruningWeights(database, org, block.id, season - 1, season + 1, month),
    listReplantSlots(database, org, block.id, period),
    listSeasonTasks(database, org, block.id, period),
    loadRecordedLabour(org, block.id, season),
  ]);
  const input: BlockReportInput = {
    block: {
      id: block.id,
      name: block.name,
      variety: block.variety,
      clone: block.clone,
      rootstock: block.rootstock,
      plantingYear: block.planting_year,
      trainingSystem: block.training_system,
      rowSpacingM: Number(block.row_spacing_m),
      vineSpacingM: Number(block.vine_spacing_m),
      rowCount: block.row_count,
      vinesPerRow: block.vines_per_row,
      vinesPerPanel: block.vines_per_panel,
    },
    season,
    seasonStartMonth: month,
    units: member.unitSystem,
    slots,
    kindRows: counts.kinds,
    scoutedRows: counts.scouted,
    observations: counts.observations,
    measured,
    measurements,
    recordedWeights,
    replant,
    tasks,
    recordedLabour,
    options,
    settings,
  };
  return buildBlockReport(input);
}

/**
 * The code that turns records into a report, by content: a snapshot made by other code is not
 * used. Read from the sources beside the running server; without them each process keeps its own.
 */
let codeVersion: Promise<string> | undefined;
function reportCode() {
  codeVersion ??= (async () => {
    try {
      const dir = path.join(process.cwd(), 'lib');
      const files = (await readdir(dir, { recursive: true })).filter((f) => /\.tsx?$/.test(f)).sort();
      const hash = createHash('sha256');
      for (const file of files) hash.update(file).update(await readFile(path.join(dir, file)));
      return hash.digest('hex');
    } catch {
      return randomUUID();
    }
  })();
  return codeVersion;
}

const BLOCKS_AT_ONCE = 2;

interface SeasonAsk {
  block: BlockRow;
  season: number;
  options: ReportOptions;
  settings: ViticultureSettings;
}

/** Everything a block's season report depends on besides the records its revision counts. */
function snapshotKey(member: Member, ask: SeasonAsk, code: string): SnapshotLookup {
  const key = createHash('sha256')
    .update(JSON.stringify([code, member.unitSystem, member.seasonStartMonth, ask.block, ask.options, ask.settings]))
    .digest('hex');
  return { blockId: ask.block.id, season: ask.season, key };
}

/**
 * Blocks' season reports, each from its snapshot while the block has not changed since (see
 * db/migrations/20261205-01-report-snapshots.ts), else worked out from the records and kept.
 * Those to work out go a few at a time, each running its queries side by side, so an estate of
 * many blocks neither waits for them one by one nor takes the whole pool.
 */
async function blockSeasons(database: Db, member: Member, asks: SeasonAsk[]): Promise<BlockReport[]> {
  const code = await reportCode();
  const lookups = asks.map((ask) => snapshotKey(member, ask, code));
  const found = await findSnapshots(database, lookups);
  const reports = found.map((f) => f.report);
  const missing = asks.flatMap((ask, i) => (reports[i] ? [] : [i]));
  for (let at = 0; at < missing.length; at += BLOCKS_AT_ONCE) {
    await Promise.all(
      missing.slice(at, at + BLOCKS_AT_ONCE).map(async (i) => {
        const { block, season, options, settings } = asks[i]!;
        const report = await workOutBlockSeason(database, member, block, season, options, settings);
        // A report that could not be kept is still the right answer; the next read works it out again.
        await saveSnapshot(database, { ...lookups[i]!, revision: found[i]!.revision, report }).catch((err: unknown) =>
          console.error('A block report could not be kept', err),
        );
        reports[i] = report;
      }),
    );
  }
  return reports as BlockReport[];
}

/** A block's season report, with the season before (or the one asked for) side by side. */
export async function loadBlockReport(member: Member, blockId: string, options: ReportOptions, now = new Date()): Promise<BlockReportResponse> {
  const database = db();
  const block = await blockOf(database, member, blockId);
  const month = member.seasonStartMonth;
  const seasons = await listSeasons(database, member.organisationId, block.id, month);
  const season = options.season ?? defaultSeason(seasons, now, month);
  const previous = options.compare === 'none' ? null : (options.compare ?? season - 1);
  const settings = (await settingsForBlocks(database, member.organisationId, [block.id]))(block.id);
  const { season: _s, compare: _c, ...inputs } = options;
  const asks: SeasonAsk[] = [{ block, season, options: inputs, settings }];
  if (previous !== null && previous !== season) {
    // The other season is read from its own records; only the inputs a person chose carry over.
    const { budsPerVine: _b, budbreakPercent: _p, budTarget: _t, ...shared } = inputs;
    asks.push({ block, season: previous, options: shared, settings });
  }
  const [[report, before], persisted] = await Promise.all([
    blockSeasons(database, member, asks),
    asks.length > 1
      ? listPersistedProblems(database, member.organisationId, block.id, seasonBounds(season, month), seasonBounds(previous!, month))
      : Promise.resolve(null),
  ]);
  const comparison: Comparison | null = before && persisted ? compareReports(report!, before, persisted) : null;
  return { report: report!, comparison, seasons };
}

/** Every active block's season. */
export async function loadEstateReport(member: Member, options: ReportOptions, now = new Date()): Promise<EstateReportResponse> {
  const database = db();
  const seasons = await listSeasons(database, member.organisationId, undefined, member.seasonStartMonth);
  const season = options.season ?? defaultSeason(seasons, now, member.seasonStartMonth);
  const { budsPerVine: _b, budbreakPercent: _p, budTarget: _t, minutesPerVine: _m, season: _s, compare: _c, ...shared } = options;
  const [all, settingsOf] = await Promise.all([listBlocks(database, member.organisationId), settingsForBlocks(database, member.organisationId)]);
  const blocks = await blockSeasons(
    database,
    member,
    all.map((block) => ({ block, season, options: shared, settings: settingsOf(block.id) })),
  );
  return { ...buildEstateReport(season, blocks), seasons };
}

const EXPORT_PAGE = 2000;

/**
 * The season's observations as CSV, streamed: each pull reads the next keyset page, so the server
 * holds one page at a time however large the export, and a slow reader slows the queries down.
 */
export async function exportObservations(member: Member, season: number, blockId?: string): Promise<{ filename: string; stream: ReadableStream<Uint8Array> }> {
  const database = db();
  const block = blockId ? await blockOf(database, member, blockId) : undefined;
  const period = seasonBounds(season, member.seasonStartMonth);
  const encoder = new TextEncoder();
  let cursor: ExportCursor | null = null;
  let headerSent = false;
  const stream = new ReadableStream<Uint8Array>(
    {
      async pull(controller) {
        if (!headerSent) {
          headerSent = true;
          controller.enqueue(encoder.encode(`\uFEFF${csvHeader()}`));
          return;
        }
        const rows = await listExportPage(database, member.organisationId, period, block?.id, cursor, EXPORT_PAGE);
        if (rows.length) {
          controller.enqueue(encoder.encode(rows.map((r) => csvLine(r, member.seasonStartMonth)).join('')));
          const last = rows[rows.length - 1]!;
          cursor = { observedAt: last.cursorAt, id: last.id };
        }
        if (rows.length < EXPORT_PAGE) controller.close();
      },
    },
    { highWaterMark: 1 },
  );
  const name = block
    ? block.name
        .toLowerCase()
        .replace(/[^a-z0-9]+/g, '-')
        .replace(/^-|-$/g, '') || 'block'
    : 'all-blocks';
  return { filename: `vineward-observations-${name}-${season}.csv`, stream };
}

/** A block's yields and pruning weights of one season. */
export async function listBlockMeasurements(member: Member, query: { blockId: string; season: number }): Promise<MeasurementView[]> {
  const block = await getBlock(db(), member.organisationId, query.blockId);
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
  return listMeasurements(db(), member.organisationId, block.id, seasonBounds(query.season, member.seasonStartMonth));
}

/** Records a yield or pruning weight; a vine's entry must name one of the block's slots. */
export async function recordMeasurement(member: Member, input: MeasurementInput): Promise<MeasurementView> {
  const database = db();
  const block = await getBlock(database, member.organisationId, input.blockId);
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.', { blockId: ['No such block'] });
  let positionId: string | null = null;
  if (input.position !== null) {
    const vine = await findVineByAddress(database, member.organisationId, block.id, input.row, input.position);
    if (!vine)
      throw new AppError('invalid-input', `Row ${input.row} has no vine ${input.position} in ${block.name}.`, { position: ['No such vine in this row'] });
    positionId = vine.positionId;
  } else {
    if (!(await hasBlockRow(database, block.id, input.row)))
      throw new AppError('invalid-input', `${block.name} has no row ${input.row}.`, { row: ['No such row in this block'] });
  }
  const id = await insertMeasurement(database, {
    organisation_id: member.organisationId,
    block_id: block.id,
    kind: input.kind,
    row_number: input.row,
    position: input.position,
    position_id: positionId,
    vines: input.vines,
    weight_kg: weightKg(input),
    clusters: input.kind === 'yield' ? input.clusters : null,
    measured_on: input.measuredOn,
    note: input.note,
    recorded_by: member.userId,
  });
  return (await getMeasurement(database, member.organisationId, id))!;
}

/** Managers remove any entry; others only their own, as with observations. */
export async function removeMeasurement(member: Member, id: string): Promise<void> {
  const database = db();
  const found = UUID.test(id) ? await getMeasurement(database, member.organisationId, id) : undefined;
  if (!found) throw new AppError('not-found', 'There is no such entry in your organisation.');
  if (!can(member.role, 'edit-any-observation') && found.recordedBy !== member.userId) {
    throw new AppError('forbidden', 'Only a manager or the person who entered it can remove this weight.');
  }
  await deleteMeasurement(database, member.organisationId, id);
}
