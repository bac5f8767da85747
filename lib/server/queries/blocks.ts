import 'server-only';
import type { Db } from '@/lib/server/db';

export interface BlockRow {
  id: string;
  organisation_id: string;
  name: string;
  variety: string;
  clone: string | null;
  rootstock: string | null;
  planting_year: number | null;
  training_system: 'cane' | 'spur' | 'other';
  row_spacing_m: string;
  vine_spacing_m: string;
  row_count: number;
  vines_per_row: number;
  vines_per_panel: number | null;
  first_row: number;
  row_order: 'ascending' | 'descending';
  position_origin: string | null;
  row_bearing_deg: number | null;
  notes: string | null;
  archived_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

/** A block of this organisation (archived ones too), or undefined: never another organisation's. */
export function getBlock(db: Db, organisationId: string, blockId: string) {
  return db<BlockRow>('blocks').where({ id: blockId, organisation_id: organisationId }).first();
}

export function listBlockRows(db: Db, blockId: string) {
  return db('block_rows').where({ block_id: blockId }).orderBy('row_number').select<{ row_number: number; vine_count: number }[]>('row_number', 'vine_count');
}

export async function hasBlockRow(db: Db, blockId: string, rowNumber: number) {
  return !!(await db('block_rows').where({ block_id: blockId, row_number: rowNumber }).first('row_number'));
}

export interface PositionRow {
  id: string;
  row_number: number;
  position: number;
  status: 'planted' | 'missing' | 'dead' | 'replant';
  replant_year: number | null;
}

export function listPositions(db: Db, blockId: string, rowNumber?: number) {
  const q = db('vine_positions').where('block_id', blockId);
  if (rowNumber !== undefined) q.andWhere('row_number', rowNumber);
  return q.orderBy(['row_number', 'position']).select<PositionRow[]>('id', 'row_number', 'position', 'status', 'replant_year');
}

export type SlotStatus = PositionRow['status'];
export type StatusCounts = Record<SlotStatus, number>;

export const emptyCounts = (): StatusCounts => ({ planted: 0, missing: 0, dead: 0, replant: 0 });

export function listBlocks(db: Db, organisationId: string, o: { archived?: boolean } = {}) {
  const q = db<BlockRow>('blocks').where({ organisation_id: organisationId });
  if (!o.archived) q.whereNull('archived_at');
  return q.orderByRaw('lower(name)').select('*');
}

/** Slots by status for each block of the organisation, in one pass. */
export async function countSlotsByBlock(db: Db, organisationId: string) {
  const rows = await db('vine_positions as vp')
    .join('blocks as b', 'b.id', 'vp.block_id')
    .where('b.organisation_id', organisationId)
    .groupBy('vp.block_id', 'vp.status')
    .select<{ block_id: string; status: SlotStatus; n: number }[]>('vp.block_id', 'vp.status', db.raw('count(*)::int as n'));
  const byBlock = new Map<string, StatusCounts>();
  for (const r of rows) {
    const counts = byBlock.get(r.block_id) ?? emptyCounts();
    counts[r.status] = r.n;
    byBlock.set(r.block_id, counts);
  }
  return byBlock;
}

export async function countSlotsByRow(db: Db, blockId: string) {
  const rows = await db('vine_positions')
    .where({ block_id: blockId })
    .groupBy('row_number', 'status')
    .select<{ row_number: number; status: SlotStatus; n: number }[]>('row_number', 'status', db.raw('count(*)::int as n'));
  const byRow = new Map<number, StatusCounts>();
  for (const r of rows) {
    const counts = byRow.get(r.row_number) ?? emptyCounts();
    counts[r.status] = r.n;
    byRow.set(r.row_number, counts);
  }
  return byRow;
}

/** The block locked for a layout change, so two managers' edits run one after the other. */
export function getBlockForUpdate(db: Db, organisationId: string, blockId: string) {
  return db<BlockRow>('blocks').where({ id: blockId, organisation_id: organisationId }).forUpdate().first();
}

export type BlockColumns = Pick<
  BlockRow,
  | 'name'
  | 'variety'
  | 'clone'
  | 'rootstock'
  | 'planting_year'
  | 'training_system'
  | 'row_count'
  | 'vines_per_row'
  | 'vines_per_panel'
  | 'first_row'
  | 'row_order'
  | 'position_origin'
  | 'row_bearing_deg'
  | 'notes'
> & { row_spacing_m: number; vine_spacing_m: number };

export async function insertBlock(db: Db, organisationId: string, columns: BlockColumns) {
  const [row] = await db('blocks')
    .insert({ ...columns, organisation_id: organisationId })
    .returning<BlockRow[]>('*');
  return row!;
}

export async function updateBlock(db: Db, blockId: string, columns: Partial<BlockColumns> & { archived_at?: Date | null }) {
  const [row] = await db('blocks')
    .where('id', blockId)
    .update({ ...columns, updated_at: db.fn.now() })
    .returning<BlockRow[]>('*');
  return row!;
}

/**
 * Whether anything outside the layout names this block's row numbers: observations, flags, task
 * items, measurements… (every table with both block_id and row_number, found in the catalogue so
 * that tables added later are covered too) and sampling plans, whose addresses are stored in JSON.
 */
export async function blockHasFieldRecords(db: Db, blockId: string) {
  const { rows: tables } = await db.raw<{ rows: { name: string }[] }>(
    `select c.table_name as name from information_schema.columns c
     join information_schema.columns r on r.table_schema = c.table_schema and r.table_name = c.table_name and r.column_name = 'row_number'
     join information_schema.tables t on t.table_schema = c.table_schema and t.table_name = c.table_name and t.table_type = 'BASE TABLE'
     where c.table_schema = current_schema() and c.column_name = 'block_id' and c.table_name not in ('block_rows', 'vine_positions')`,
  );
  const names = [...tables.map((t) => t.name), 'sampling_plans'];
  const found = await Promise.all(names.map((name) => db(name).where('block_id', blockId).first(db.raw('1 as x'))));
  return found.some(Boolean);
}

/**
 * Moves every row number of the block by `delta` (the slots follow through the foreign key's
 * ON UPDATE CASCADE). Negating first keeps the primary key unique halfway through the update.
 */
export async function shiftRowNumbers(db: Db, blockId: string, delta: number) {
  await db.raw('update block_rows set row_number = -row_number where block_id = ?', [blockId]);
  await db.raw('update block_rows set row_number = -row_number + ? where block_id = ?', [delta, blockId]);
}

/** A desired layout: every row of the block with its slot count and, optionally, one status letter per slot. */
export interface LayoutRowSpec {
  row: number;
  vines: number;
  statuses: string | null;
}

// The layout travels as one jsonb parameter: one bind value whatever the size, expanded in SQL.
const DESIRED = `d as (select * from jsonb_to_recordset(?::jsonb) as d(row_number int, vine_count int, statuses text))`;
/** The status a slot's letter asks for, or null when its row keeps its statuses. */
const wantedStatus = (position: string) => `case upper(substr(d.statuses, ${position}, 1)) when 'P' then 'planted'
  when 'M' then 'missing' when 'D' then 'dead' when 'R' then 'replant' end`;
const REMOVED_SLOT = `vp.block_id = ? and not exists (select 1 from d where d.row_number = vp.row_number and vp.position <= d.vine_count)`;

const desiredJson = (rows: LayoutRowSpec[]) => JSON.stringify(rows.map((r) => ({ row_number: r.row, vine_count: r.vines, statuses: r.statuses })));

/** What a layout would do to the block's slots: (from → to) counts, from = null for new slots, and slots removed. */
export async function summariseLayoutChange(db: Db, blockId: string, rows: LayoutRowSpec[]) {
  const json = desiredJson(rows);
  const [transitions, removed] = await Promise.all([
    db.raw<{ rows: { from_status: SlotStatus | null; to_status: SlotStatus; n: number }[] }>(
      `with ${DESIRED}
       select vp.status as from_status, coalesce(${wantedStatus('p.position')}, vp.status, 'planted') as to_status, count(*)::int as n
       from d cross join lateral generate_series(1, d.vine_count) as p(position)
       left join vine_positions vp on vp.block_id = ? and vp.row_number = d.row_number and vp.position = p.position
       group by 1, 2`,
      [json, blockId],
    ),
    db.raw<{ rows: { n: number }[] }>(`with ${DESIRED} select count(*)::int as n from vine_positions vp where ${REMOVED_SLOT}`, [json, blockId]),
  ]);
  return { transitions: transitions.rows, slotsRemoved: removed.rows[0]!.n };
}

/**
 * The tables whose rows hang on a planting slot (observations, flags, task items, comments,
 * measurements…), read from the foreign keys so that later features are covered too. A slot's
 * own vines are its history, not field records, and the grid's summary of it is derived from its
 * observations: both go with it.
 */
async function slotRecordTables(db: Db) {
  const { rows } = await db.raw<{ rows: { tbl: string; col: string }[] }>(
    `select c.conrelid::regclass::text as tbl, quote_ident(a.attname) as col
     from pg_constraint c join pg_attribute a on a.attrelid = c.conrelid and a.attnum = c.conkey[1]
     where c.contype = 'f' and c.confrelid = 'vine_positions'::regclass and cardinality(c.conkey) = 1
       and c.conrelid not in ('vines'::regclass, 'grid_vines'::regclass) order by 1`,
  );
  return rows;
}

/**
 * Slots the layout would remove although field records hang on them (at most `limit`), how many
 * in all, and which kinds of record (table names).
 */
export async function listRemovedSlotsWithRecords(db: Db, blockId: string, rows: LayoutRowSpec[], limit = 20) {
  const tables = await slotRecordTables(db);
  if (tables.length === 0) return { slots: [], total: 0, kinds: [] as string[] };
  // Names come from the catalogue, already quoted by regclass and quote_ident; nothing here is user input.
  const kinds = tables.map((t, i) => `case when exists (select 1 from ${t.tbl} x where x.${t.col} = vp.id) then ${i} end`).join(', ');
  const { rows: found } = await db.raw<{ rows: { row_number: number; position: number; total: number; hits: number[] }[] }>(
    `with ${DESIRED}, hit as (
       select vp.row_number, vp.position, array_remove(array[${kinds}], null) as hits
       from vine_positions vp where ${REMOVED_SLOT})
     select row_number, position, hits, count(*) over ()::int as total from hit where cardinality(hits) > 0
     order by 1, 2 limit ?`,
    [desiredJson(rows), blockId, limit],
  );
  const used = new Set(found.flatMap((r) => r.hits));
  return {
    slots: found.map((r) => ({ row: r.row_number, position: r.position })),
    total: found[0]?.total ?? 0,
    kinds: [...used].sort().map((i) => tables[i]!.tbl.replace(/^.*\./, '').replace(/"/g, '')),
  };
}

interface PlantDefaults {
  plantingYear: number | null;
  clone: string | null;
  rootstock: string | null;
}

/**
 * Makes the block's rows and slots match `rows` in bulk SQL: removes slots and rows left out,
 * resizes and adds rows, plants new slots (with a vine of the block's planting year, clone and
 * rootstock), then applies the status letters through the slot history rules. Run inside a
 * transaction, after checking that no removed slot carries observations.
 */
export async function writeLayout(trx: Db, blockId: string, rows: LayoutRowSpec[], plant: PlantDefaults, year: number) {
  const json = desiredJson(rows);
  await trx.raw(`with ${DESIRED} delete from vine_positions vp where ${REMOVED_SLOT}`, [json, blockId]);
  await trx.raw(`with ${DESIRED} delete from block_rows br where br.block_id = ? and br.row_number not in (select row_number from d)`, [json, blockId]);
  await trx.raw(
    `with ${DESIRED}
     insert into block_rows (block_id, row_number, vine_count) select ?, d.row_number, d.vine_count from d
     on conflict (block_id, row_number) do update set vine_count = excluded.vine_count
     where block_rows.vine_count <> excluded.vine_count`,
    [json, blockId],
  );
  await trx.raw(
    `with ${DESIRED}, added as (
       insert into vine_positions (block_id, row_number, position, status)
       select ?, d.row_number, p.position, 'planted' from d cross join lateral generate_series(1, d.vine_count) as p(position)
       on conflict (block_id, row_number, position) do nothing
       returning id)
     insert into vines (position_id, planting_year, clone, rootstock) select id, ?, ?, ? from added`,
    [json, blockId, plant.plantingYear, plant.clone, plant.rootstock],
  );
  if (!rows.some((r) => r.statuses)) return;
  await createSlotChanges(trx);
  // One pass over the block's slots, each reading its letter from its row's string (a hash join on
  // the row number), rather than expanding every letter into a row and joining on the address.
  await trx.raw(
    `insert into slot_changes (position_id, status, year)
     with ${DESIRED}, wanted as (
       select vp.id, vp.status as was, ${wantedStatus('vp.position')} as status
       from vine_positions vp join d on d.row_number = vp.row_number
       where vp.block_id = ? and d.statuses is not null)
     select id, status, ? from wanted where status <> was`,
    [json, blockId, year],
  );
  await applySlotChanges(trx, plant);
}

async function createSlotChanges(trx: Db) {
  await trx.raw('drop table if exists pg_temp.slot_changes');
  await trx.raw(`create temp table slot_changes (position_id uuid primary key, status text not null, year int,
    clone text, rootstock text) on commit drop`);
}

/**
 * The slot history rules, for every row of slot_changes at once. Missing, dead and replant close
 * the vine that stood in the slot (removed in `year`); a replant then plants a new vine of that
 * year; planted again reopens the last vine (the slot was wrongly marked), or plants one if the
 * slot never had a vine.
 */
async function applySlotChanges(trx: Db, plant: PlantDefaults) {
  await trx.raw(`update vines v set removed_year = c.year,
      removal_reason = case c.status when 'replant' then 'replaced' else c.status end
    from slot_changes c where v.position_id = c.position_id and v.removed_year is null and c.status in ('missing', 'dead', 'replant')`);
  await trx.raw(
    `insert into vines (position_id, planting_year, clone, rootstock)
     select position_id, year, coalesce(clone, ?), coalesce(rootstock, ?) from slot_changes where status = 'replant'`,
    [plant.clone, plant.rootstock],
  );
  await trx.raw(`update vines v set removed_year = null, removal_reason = null from (
      select distinct on (l.position_id) l.id from vines l join slot_changes c on c.position_id = l.position_id
      where c.status = 'planted' and not exists (select 1 from vines o where o.position_id = l.position_id and o.removed_year is null)
      order by l.position_id, l.created_at desc, l.planting_year desc nulls last) latest
    where v.id = latest.id`);
  await trx.raw(
    `insert into vines (position_id, planting_year, clone, rootstock)
     select c.position_id, ?, ?, ? from slot_changes c
     where c.status = 'planted' and not exists (select 1 from vines v where v.position_id = c.position_id)`,
    [plant.plantingYear, plant.clone, plant.rootstock],
  );
  await trx.raw(`update vine_positions vp set status = c.status, replant_year = case when c.status = 'replant' then c.year end,
      updated_at = now() from slot_changes c where vp.id = c.position_id`);
}

/** One slot's new status, with the same history rules as a layout import. */
export async function changeSlotStatus(
  trx: Db,
  positionId: string,
  change: { status: SlotStatus; year: number; clone: string | null; rootstock: string | null },
  plant: PlantDefaults,
) {
  await createSlotChanges(trx);
  await trx('slot_changes').insert({ position_id: positionId, ...change });
  await applySlotChanges(trx, plant);
}

export function getPosition(db: Db, blockId: string, rowNumber: number, position: number) {
  return db('vine_positions')
    .where({ block_id: blockId, row_number: rowNumber, position })
    .first<PositionRow | undefined>('id', 'row_number', 'position', 'status', 'replant_year');
}

export interface VineRow {
  id: string;
  planting_year: number | null;
  clone: string | null;
  rootstock: string | null;
  removed_year: number | null;
  removal_reason: string | null;
  created_at: Date;
}

/** The vines that stood in a slot, the standing one first, then newest to oldest. */
export function listSlotVines(db: Db, positionId: string) {
  return db('vines')
    .where('position_id', positionId)
    .orderByRaw('removed_year is not null, created_at desc, planting_year desc nulls last')
    .select<VineRow[]>('id', 'planting_year', 'clone', 'rootstock', 'removed_year', 'removal_reason', 'created_at');
}

/** The layout as the CSV carries it: each row with its slot count and status letters. */
export async function listLayoutLetters(db: Db, blockId: string) {
  const { rows } = await db.raw<{ rows: { row: number; vines: number; statuses: string }[] }>(
    `select br.row_number as row, br.vine_count as vines,
       coalesce(string_agg(case vp.status when 'planted' then 'P' when 'missing' then 'M' when 'dead' then 'D' else 'R' end,
         '' order by vp.position), '') as statuses
     from block_rows br left join vine_positions vp on vp.block_id = br.block_id and vp.row_number = br.row_number
     where br.block_id = ? group by br.row_number, br.vine_count order by br.row_number`,
    [blockId],
  );
  return rows;
}

export function updateUnitSystem(db: Db, organisationId: string, unitSystem: 'metric' | 'imperial') {
  return db('organisations').where({ id: organisationId }).update({ unit_system: unitSystem });
}
