/**
 * A whole estate's season made in the database with set-based SQL (generate_series), for the
 * full-scale benches: its own organisation, manager and scout (the demo's password), N blocks of
 * side × side vines with about one gap in a hundred, observations spread over the season, photo
 * rows on some of them, and the rows' work passes. `npm run bench -- scale --scale=full` asks for
 * the size DESIGN.md promises; without it a small estate is made, so the bench stays quick.
 */
import { createRequire } from 'node:module';
import type { Knex } from 'knex';
import type { Member } from '@/lib/server/auth/guard';

export interface EstateSize {
  blocks: number;
  side: number;
  observations: number;
  photos: number;
}

export const SIZES: Record<'small' | 'full', EstateSize> = {
  small: { blocks: 3, side: 40, observations: 30_000, photos: 3_000 },
  full: { blocks: 9, side: 150, observations: 1_000_000, photos: 100_000 },
};

export const ESTATE_ORG = '0e57a7e0-0000-4000-8000-000000000000';
export const SEASON = 2026;
const KINDS = ['cane-diameter', 'shade-cane', 'weak-budbreak', 'trunk-injury', 'cane-injury', 'missing-vine', 'bud-injury', 'pruning-record', 'note'];
const PASSES = ['pre-pruning', 'pruning', 'brush-removal', 'tying', 'shoot-thinning'];

export const blockId = (i: number) => `0e57a7e0-0000-4000-8000-${String(i + 1).padStart(12, '0')}`;

export interface Estate {
  size: EstateSize;
  blockIds: string[];
  managerEmail: string;
  scoutEmail: string;
  manager: Member;
  vines: number;
  seconds: number;
}

/** Loads server modules outside Next: 'server-only' refuses to load there, so it is stubbed. */
export function serverModules() {
  const require = createRequire(__filename);
  const marker = require.resolve('server-only');
  require.cache[marker] = { id: marker, filename: marker, loaded: true, exports: {} } as NodeJS.Module;
}

async function time(label: string, log: (line: string) => void, run: () => Promise<unknown>) {
  const t = Date.now();
  await run();
  log(`  ${label} in ${((Date.now() - t) / 1000).toFixed(1)} s`);
}

export async function makeEstate(db: Knex, size: EstateSize, log: (line: string) => void = console.log): Promise<Estate> {
  const started = Date.now();
  await db('organisations').where({ id: ESTATE_ORG }).delete();
  await db('users').whereIn('email', ['estate-manager@example.com', 'estate-scout@example.com']).delete();
  const password = (await db('users').where({ email: 'manager@example.com' }).first('password_hash')).password_hash as string;
  await db('organisations').insert({ id: ESTATE_ORG, name: 'Bench Estate', season_start_month: 1 });
  const [manager] = await db('users').insert({ email: 'estate-manager@example.com', name: 'Estate Manager', password_hash: password }).returning('id');
  const [scout] = await db('users').insert({ email: 'estate-scout@example.com', name: 'Estate Scout', password_hash: password }).returning('id');
  await db('memberships').insert([
    { organisation_id: ESTATE_ORG, user_id: manager.id, role: 'manager' },
    { organisation_id: ESTATE_ORG, user_id: scout.id, role: 'scout' },
  ]);
  const blockIds = Array.from({ length: size.blocks }, (_, i) => blockId(i));
  await db('blocks').insert(
    blockIds.map((id, i) => ({
      id,
      organisation_id: ESTATE_ORG,
      name: `Estate block ${i + 1}`,
      variety: i % 2 ? 'Riesling' : 'Pinot noir',
      training_system: 'cane',
      planting_year: 2012,
      row_spacing_m: 2.4,
      vine_spacing_m: 1.2,
      row_count: size.side,
      vines_per_row: size.side,
      vines_per_panel: 5,
    })),
  );
  await time('blocks and vines', log, async () => {
    await db.raw(
      `insert into block_rows (block_id, row_number, vine_count)
       select b, r, ? from unnest(?::uuid[]) b cross join generate_series(1, ?) r`,
      [size.side, blockIds, size.side],
    );
    // About one vine in a hundred is a gap in the planting.
    await db.raw(
      `insert into vine_positions (block_id, row_number, position, status)
       select b, r, p, case when abs(hashint4(r * 1000 + p + length(b::text))) % 100 = 0 then 'missing' else 'planted' end
       from unnest(?::uuid[]) b cross join generate_series(1, ?) r cross join generate_series(1, ?) p`,
      [blockIds, size.side, size.side],
    );
  });
  const vines = Number((await db('vine_positions').whereIn('block_id', blockIds).where({ status: 'planted' }).count({ n: '*' }))[0]!.n);

  await time(`${size.observations.toLocaleString('en-US')} observations`, log, async () => {
    // Block by block, so each statement's transition table (the grid summary's triggers read it) stays small.
    const perBlock = Math.ceil(size.observations / size.blocks);
    for (const id of blockIds) {
      await db.raw(
        `insert into observations (id, organisation_id, block_id, position_id, row_number, position, kind, data, note,
           observed_at, recorded_by, severity, status, closed_at, payload_sha256)
         select gen_random_uuid(), ?, vp.block_id, vp.id, vp.row_number, vp.position,
           k.kind, case k.kind when 'weak-budbreak' then jsonb_build_object('budsRetained', 30, 'budsPushed', 10 + g % 20)
                               when 'cane-diameter' then jsonb_build_object('diameterMm', 6 + (g % 60) / 10.0)
                               else '{}'::jsonb end, '',
           timestamptz '${SEASON}-01-05 07:00Z' + ((g * 37) % 240) * interval '1 day' + (g % 540) * interval '1 minute', ?,
           case when h < 55 then 0 when h < 80 then 1 when h < 95 then 2 else 3 end,
           case when g % 7 = 0 then 'closed' else 'open' end, case when g % 7 = 0 then timestamptz '${SEASON}-09-01Z' end,
           'estate-' || g
         from generate_series(1, ?::int) g
         cross join lateral (select abs(hashint4(g)) % 100 as h, abs(hashint4(g * 31)) % (?::int * ?::int) as slot, (?::text[])[1 + (g % 9)] as kind) k
         join vine_positions vp on vp.block_id = ? and vp.row_number = 1 + k.slot / ?::int and vp.position = 1 + k.slot % ?::int`,
        [ESTATE_ORG, scout.id, perBlock, size.side, size.side, KINDS, id, size.side, size.side],
      );
    }
  });

  await time(`${size.photos.toLocaleString('en-US')} photo rows`, log, () =>
    db.raw(
      `insert into photos (id, organisation_id, observation_id, uploaded_by, status, object_key, thumb_key, content_type, bytes, width, height, sha256, taken_at, stored_at)
       select gen_random_uuid(), o.organisation_id, o.id, o.recorded_by, 'stored', 'estate/' || o.id || '.jpg', 'estate/' || o.id || '-thumb.jpg',
              'image/jpeg', 900000, 4000, 3000, md5(o.id::text), o.observed_at, o.observed_at
       from (select * from observations where organisation_id = ? order by payload_sha256 limit ?) o`,
      [ESTATE_ORG, size.photos],
    ),
  );

  await time('a season of row work', log, () =>
    // Every pass on every row of every block, a crew of two to four spending a few hours on each.
    db.raw(
      `insert into row_work (id, organisation_id, block_id, row_number, pass, crew_size, person_hours, started_at, finished_at, note, recorded_by, payload_sha256)
       select gen_random_uuid(), ?, br.block_id, br.row_number, p.pass, 2 + br.row_number % 3, 1.5 + (br.row_number % 5) * 0.25,
              timestamptz '${SEASON}-01-10 07:00Z' + (p.n * 40 + br.row_number / 6) * interval '1 day',
              timestamptz '${SEASON}-01-10 10:00Z' + (p.n * 40 + br.row_number / 6) * interval '1 day', '', ?, 'estate-work'
       from block_rows br cross join unnest(?::text[]) with ordinality p(pass, n)
       where br.block_id = any(?::uuid[])`,
      [ESTATE_ORG, manager.id, PASSES, blockIds],
    ),
  );
  await time('vacuum analyze', log, async () => {
    await db.raw('vacuum analyze observations, grid_vines, grid_counts, photos, row_work, vine_positions, block_rows');
  });
  const org = await db('organisations').where({ id: ESTATE_ORG }).first();
  return {
    size,
    blockIds,
    managerEmail: 'estate-manager@example.com',
    scoutEmail: 'estate-scout@example.com',
    manager: {
      userId: manager.id,
      email: 'estate-manager@example.com',
      name: 'Estate Manager',
      organisationId: ESTATE_ORG,
      organisationName: 'Bench Estate',
      unitSystem: org.unit_system,
      seasonStartMonth: org.season_start_month,
      role: 'manager',
      memberships: [],
    },
    vines,
    seconds: (Date.now() - started) / 1000,
  };
}

export async function dropEstate(db: Knex) {
  await db('organisations').where({ id: ESTATE_ORG }).delete();
  await db('users').whereIn('email', ['estate-manager@example.com', 'estate-scout@example.com']).delete();
}
