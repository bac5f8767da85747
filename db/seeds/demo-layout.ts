/**
 * The demo estate's blocks: invented names, common varieties, and one large block (150 rows × 150
 * vines) so that the grid and the benchmarks have something real to chew on. Missing, dead and
 * replanted slots follow a fixed pattern so every start shows the same estate.
 */
import type { Knex } from 'knex';

export interface DemoBlock {
  id: string;
  name: string;
  variety: string;
  clone: string;
  rootstock: string;
  plantingYear: number;
  trainingSystem: 'cane' | 'spur';
  rowSpacingM: number;
  vineSpacingM: number;
  rowCount: number;
  vinesPerRow: number;
  vinesPerPanel: number;
  positionOrigin: string;
  rowBearingDeg: number;
  /** Rows shorter than the rest (a corner cut by the creek, a track). */
  shortRows?: Record<number, number>;
}

export const DEMO_BLOCKS: DemoBlock[] = [
  {
    id: '0b10c4a0-0000-4000-8000-000000000001',
    name: 'Upper Terrace',
    variety: 'Pinot Noir',
    clone: 'PN-14',
    rootstock: '3309C',
    plantingYear: 2009,
    trainingSystem: 'cane',
    rowSpacingM: 2.4,
    vineSpacingM: 1.2,
    rowCount: 24,
    vinesPerRow: 60,
    vinesPerPanel: 5,
    positionOrigin: 'Vine 1 at the track end',
    rowBearingDeg: 0,
  },
  {
    id: '0b10c4a0-0000-4000-8000-000000000002',
    name: 'Creek Flat',
    variety: 'Sauvignon Blanc',
    clone: 'SB-3',
    rootstock: '101-14',
    plantingYear: 2004,
    trainingSystem: 'cane',
    rowSpacingM: 2.7,
    vineSpacingM: 1.5,
    rowCount: 150,
    vinesPerRow: 150,
    vinesPerPanel: 4,
    positionOrigin: 'Vine 1 at the creek end',
    rowBearingDeg: 10,
  },
  {
    id: '0b10c4a0-0000-4000-8000-000000000003',
    name: 'Schoolhouse Slope',
    variety: 'Syrah',
    clone: 'SY-7',
    rootstock: 'Riparia Gloire',
    plantingYear: 2015,
    trainingSystem: 'spur',
    rowSpacingM: 2.5,
    vineSpacingM: 1.0,
    rowCount: 40,
    vinesPerRow: 80,
    vinesPerPanel: 6,
    positionOrigin: 'Vine 1 at the bottom of the slope',
    rowBearingDeg: 170,
  },
  {
    id: '0b10c4a0-0000-4000-8000-000000000004',
    name: 'North Bench',
    variety: 'Chardonnay',
    clone: 'CH-95',
    rootstock: '5C',
    plantingYear: 2019,
    trainingSystem: 'cane',
    rowSpacingM: 2.4,
    vineSpacingM: 1.4,
    rowCount: 12,
    vinesPerRow: 45,
    vinesPerPanel: 5,
    positionOrigin: 'Vine 1 at the shed end',
    rowBearingDeg: 90,
    shortRows: { 1: 30, 2: 34, 3: 38, 4: 42 },
  },
];

export async function seedDemoLayout(knex: Knex, organisationId: string) {
  for (const b of DEMO_BLOCKS) {
    const exists = await knex('blocks').where({ id: b.id }).first('id');
    if (exists) continue;
    await knex.transaction(async (trx) => {
      await trx('blocks').insert({
        id: b.id,
        organisation_id: organisationId,
        name: b.name,
        variety: b.variety,
        clone: b.clone,
        rootstock: b.rootstock,
        planting_year: b.plantingYear,
        training_system: b.trainingSystem,
        row_spacing_m: b.rowSpacingM,
        vine_spacing_m: b.vineSpacingM,
        row_count: b.rowCount,
        vines_per_row: b.vinesPerRow,
        vines_per_panel: b.vinesPerPanel,
        position_origin: b.positionOrigin,
        row_bearing_deg: b.rowBearingDeg,
      });
      await trx('block_rows').insert(
        Array.from({ length: b.rowCount }, (_, i) => ({
          block_id: b.id,
          row_number: i + 1,
          vine_count: b.shortRows?.[i + 1] ?? b.vinesPerRow,
        })),
      );
      await trx.raw(
        `insert into vine_positions (block_id, row_number, position, status)
         select r.block_id, r.row_number, p, 'planted' from block_rows r, generate_series(1, r.vine_count) p
         where r.block_id = ?`,
        [b.id],
      );
      // A fixed pseudo-random pattern: about 2% missing, 1% dead, 1.5% replanted in recent years.
      // Removal reasons use the words the slot editor and layout import write: missing, dead, replaced.
      await trx.raw(
        `update vine_positions set
           status = case when h < 20 then 'missing' when h < 30 then 'dead' else 'replant' end,
           replant_year = case when h >= 30 then 2022 + (h % 3) end
         from (select id as pid, abs(hashtext(block_id::text || ':' || row_number || ':' || position)) % 1000 as h
               from vine_positions where block_id = ?) x
         where id = x.pid and x.h < 45`,
        [b.id],
      );
      await trx.raw(
        `insert into vines (position_id, planting_year, clone, rootstock, removed_year, removal_reason)
         select id, ?, ?, ?, case when status <> 'planted' then coalesce(replant_year, 2024) - 1 end,
                case when status = 'replant' then 'replaced' when status <> 'planted' then status end
         from vine_positions where block_id = ?`,
        [b.plantingYear, b.clone, b.rootstock, b.id],
      );
      await trx.raw(
        `insert into vines (position_id, planting_year, clone, rootstock)
         select id, replant_year, ?, ? from vine_positions where block_id = ? and status = 'replant'`,
        [b.clone, b.rootstock, b.id],
      );
    });
  }
}
