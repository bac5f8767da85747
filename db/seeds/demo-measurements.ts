/**
 * What the demo's season reports read beyond the season of observations: the season before it (so
 * year-over-year has something to compare, with the cold low corner of Creek Flat and its headland
 * trunks troubled both years), and the weights taken by hand: Creek Flat's sample vines picked at
 * both harvests, row samples on Upper Terrace weighed at pruning and at harvest, and Schoolhouse
 * Slope's row samples at the last harvest. Last season's findings were closed when it ended, so the
 * grid's open view is unchanged. Ids come from each record's meaning: a second run adds nothing.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { balancedPruningBuds, BALANCED_PRUNING_FORMULAS, observationSeverity, type ObservationData, type ObservationKind } from '../../lib/viticulture';
import { DEMO_USERS } from './demo';
import { DEMO_BLOCKS } from './demo-layout';
import { demoId } from './demo-observations';

const PREVIOUS = 2025;
const CURRENT = 2026;

const user = (role: 'manager' | 'scout' | 'pruner') => DEMO_USERS.find((u) => u.role === role)!.id;
const blockId = (name: string) => DEMO_BLOCKS.find((b) => b.name === name)!.id;

/** mulberry32, as the season seed uses: the same estate on every run. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const between = (rand: () => number, lo: number, hi: number) => lo + rand() * (hi - lo);
const round1 = (n: number) => Math.round(n * 10) / 10;
const round2 = (n: number) => Math.round(n * 100) / 100;

function addDays(isoDay: string, days: number) {
  const d = new Date(`${isoDay}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

interface Draft {
  key: string;
  block: string;
  row: number;
  position: number;
  kind: ObservationKind;
  data: ObservationData;
  day: string;
  by: string;
}

function previousSeason(): Draft[] {
  const out: Draft[] = [];
  const scout = user('scout');
  const pruner = user('pruner');
  let rand = random(2025);

  // Creek Flat's low corner held cold air that spring too, a little less of it.
  for (let row = 105; row <= 150; row++) {
    for (let position = 1; position <= 50; position += 2) {
      const distance = Math.hypot(150 - row, position - 1);
      const percent = Math.max(0, Math.min(100, Math.min(94, 20 + distance * 1.9) + between(rand, -12, 12)));
      const retained = 28 + Math.floor(rand() * 5);
      out.push({
        key: `cf:budbreak:${row}:${position}`,
        block: 'Creek Flat',
        row,
        position,
        kind: 'weak-budbreak',
        data: { budsRetained: retained, budsPushed: Math.round((retained * percent) / 100) },
        day: addDays('2025-04-24', Math.floor((150 - row) / 8)),
        by: scout,
      });
    }
  }
  for (let row = 5; row < 105; row += 10) {
    for (let position = 5; position <= 150; position += 10) {
      const retained = 28 + Math.floor(rand() * 5);
      const percent = rand() < 0.05 ? between(rand, 55, 74) : between(rand, 78, 97);
      out.push({
        key: `cf:budbreak-sample:${row}:${position}`,
        block: 'Creek Flat',
        row,
        position,
        kind: 'weak-budbreak',
        data: { budsRetained: retained, budsPushed: Math.round((retained * percent) / 100) },
        day: '2025-04-30',
        by: scout,
      });
    }
  }
  // The headland row was already being hit by the mower; vines 3 and 9 were the worst then too.
  for (let position = 1; position <= 150; position++) {
    const forced = position === 3 || position === 9;
    if (!forced && rand() > 0.3) continue;
    const severity = forced ? 'moderate' : rand() < 0.6 ? 'light' : 'moderate';
    const girdling = Math.round(severity === 'moderate' ? between(rand, 15, 40) : between(rand, 0, 15));
    out.push({
      key: `cf:trunk:1:${position}`,
      block: 'Creek Flat',
      row: 1,
      position,
      kind: 'trunk-injury',
      data: { cause: 'mechanical', severity, girdlingPercent: girdling },
      day: addDays('2025-11-12', position % 10),
      by: pruner,
    });
  }
  // Shade canes by the tree line, before the trees' lower limbs grew out further.
  for (let row = 30; row <= 90; row++) {
    for (let position = 124; position <= 150; position++) {
      if (rand() > 0.08 + ((position - 124) / 26) * 0.3) continue;
      out.push({
        key: `cf:shade:${row}:${position}`,
        block: 'Creek Flat',
        row,
        position,
        kind: 'shade-cane',
        data: {
          longestInternodeMm: Math.round(between(rand, 95, 160)),
          exposure: rand() < 0.7 ? 'shade' : 'partial',
          colourGood: rand() < 0.5,
          diameterMm: round1(between(rand, 6.2, 9.8)),
        },
        day: addDays('2025-11-18', row % 6),
        by: scout,
      });
    }
  }
  // The crew lead's spot checks at the winter pruning that opened the season.
  for (let row = 3; row <= 150; row += 10) {
    for (let position = 2; position <= 150; position += 3) {
      const weightKg = between(rand, 0.55, 1.35);
      const target = balancedPruningBuds(weightKg, BALANCED_PRUNING_FORMULAS.vinifera, 'kg');
      const slip = rand() < 0.8 ? Math.round(between(rand, -2, 2)) : Math.round(between(rand, -8, 10));
      out.push({
        key: `cf:pruning:${row}:${position}`,
        block: 'Creek Flat',
        row,
        position,
        kind: 'pruning-record',
        data: { canesKept: 2, budsPerCane: Math.max(6, Math.round((target - 4) / 2) + slip), renewalSpurs: 2, pruningWeightKg: round1(weightKg) },
        day: addDays('2025-01-27', Math.floor(row / 10)),
        by: pruner,
      });
      if (position % 9 !== 2) continue;
      for (let cane = 1; cane <= 2; cane++) {
        out.push({
          key: `cf:cane:${row}:${position}:${cane}`,
          block: 'Creek Flat',
          row,
          position,
          kind: 'cane-diameter',
          data: {
            diameterMm: round1(between(rand, 7, 12.8)),
            longestInternodeMm: Math.round(between(rand, 55, 110)),
            exposure: rand() < 0.8 ? 'sun' : 'partial',
            colourGood: rand() < 0.9,
          },
          day: addDays('2025-01-23', Math.floor(row / 10)),
          by: pruner,
        });
      }
    }
  }

  // A milder winter at the foot of Schoolhouse Slope.
  rand = random(2026);
  for (let row = 1; row <= 40; row += 2) {
    for (let position = 1; position <= 14; position++) {
      if (rand() > 0.5) continue;
      const budsCut = 20;
      const killed = Math.round(budsCut * Math.max(0, Math.min(1, between(rand, 0.45, 0.6) - position * 0.035)));
      out.push({
        key: `ss:bud:${row}:${position}`,
        block: 'Schoolhouse Slope',
        row,
        position,
        kind: 'bud-injury',
        data: { budsCut, primariesDead: killed },
        day: addDays('2025-01-07', row % 4),
        by: scout,
      });
    }
  }
  return out;
}

interface Measurement {
  key: string;
  block: string;
  kind: 'yield' | 'pruning-weight';
  row: number;
  position: number | null;
  vines: number;
  weightKg: number;
  clusters: number | null;
  day: string;
  note?: string;
}

/**
 * Creek Flat's sample vines picked at both harvests: the vines whose prunings were weighed on their
 * pruning records, so each harvest pairs with the next winter's wood (the Ravaz index). The cold
 * corner carries less fruit for its wood.
 */
function creekFlatHarvests(weights: { row: number; position: number; season: number; weightKg: number }[]): Measurement[] {
  const out: Measurement[] = [];
  const rand = random(909);
  for (const w of weights) {
    // The wood weighed at this winter's pruning grew beside last season's crop.
    if (w.season !== CURRENT || w.position % 12 !== 2) continue;
    const cold = w.row >= 105 && w.position < 50;
    for (const season of [PREVIOUS, CURRENT]) {
      const ravaz = cold ? between(rand, 2.8, 4.8) : between(rand, 4.8, 8.6);
      const kg = round2(w.weightKg * ravaz * (season === CURRENT ? between(rand, 0.92, 1.08) : 1));
      const clusterG = between(rand, 98, 122);
      out.push({
        key: `cf:yield:${season}:${w.row}:${w.position}`,
        block: 'Creek Flat',
        kind: 'yield',
        row: w.row,
        position: w.position,
        vines: 1,
        weightKg: kg,
        clusters: Math.max(1, Math.round((kg * 1000) / clusterG)),
        day: addDays(`${season}-09-14`, Math.floor(w.row / 20)),
      });
    }
  }
  return out;
}

/** Row samples: ten vines weighed together, as a crew does with a bin and a hanging scale. */
function rowSamples(): Measurement[] {
  const out: Measurement[] = [];
  const rand = random(4242);
  for (let row = 2; row <= 22; row += 4) {
    const wood = round2(between(rand, 6.5, 10.5));
    out.push({
      key: `ut:prunings:${CURRENT}:${row}`,
      block: 'Upper Terrace',
      kind: 'pruning-weight',
      row,
      position: null,
      vines: 10,
      weightKg: wood,
      clusters: null,
      day: addDays('2026-02-09', row % 5),
      note: 'Vines 21–30, one bin.',
    });
    const crop = round2(wood * between(rand, 4.2, 7.8) * (row >= 8 && row <= 14 ? 0.7 : 1));
    out.push({
      key: `ut:yield:${PREVIOUS}:${row}`,
      block: 'Upper Terrace',
      kind: 'yield',
      row,
      position: null,
      vines: 10,
      weightKg: crop,
      clusters: Math.round((crop * 1000) / between(rand, 88, 104)),
      day: addDays('2025-09-22', row % 4),
      note: 'Vines 21–30.',
    });
    const next = round2(crop * between(rand, 0.85, 1.05) * (row >= 8 && row <= 14 ? 0.8 : 1));
    out.push({
      key: `ut:yield:${CURRENT}:${row}`,
      block: 'Upper Terrace',
      kind: 'yield',
      row,
      position: null,
      vines: 10,
      weightKg: next,
      clusters: Math.round((next * 1000) / between(rand, 86, 102)),
      day: addDays('2026-09-24', row % 4),
      note: 'Vines 21–30; hail strip rows picked light.',
    });
  }
  for (let row = 5; row <= 40; row += 10) {
    const kg = round2(12 * between(rand, 2.6, 3.6) * (row <= 10 ? 0.75 : 1));
    out.push({
      key: `ss:yield:${CURRENT}:${row}`,
      block: 'Schoolhouse Slope',
      kind: 'yield',
      row,
      position: null,
      vines: 12,
      weightKg: kg,
      clusters: Math.round((kg * 1000) / between(rand, 135, 160)),
      day: addDays('2026-10-02', row % 3),
      note: 'Vines 31–42.',
    });
  }
  return out;
}

const hash = (value: unknown) => createHash('sha256').update(JSON.stringify(value)).digest('hex');

export async function seedDemoMeasurements(knex: Knex, organisationId: string) {
  const names = ['Creek Flat', 'Upper Terrace', 'Schoolhouse Slope'];
  const slots: { id: string; block_id: string; row_number: number; position: number }[] = await knex('vine_positions')
    .whereIn('block_id', names.map(blockId))
    .select('id', 'block_id', 'row_number', 'position');
  const slotAt = new Map(slots.map((s) => [`${s.block_id}:${s.row_number}:${s.position}`, s.id]));

  const observations = [];
  for (const d of previousSeason()) {
    const positionId = slotAt.get(`${blockId(d.block)}:${d.row}:${d.position}`);
    if (!positionId) continue;
    const id = demoId(`observation:${PREVIOUS}:${d.key}`);
    const observedAt = `${d.day}T${String(8 + (d.position % 8)).padStart(2, '0')}:${String((d.row * 7) % 60).padStart(2, '0')}:00Z`;
    observations.push({
      id,
      organisation_id: organisationId,
      block_id: blockId(d.block),
      position_id: positionId,
      row_number: d.row,
      position: d.position,
      kind: d.kind,
      data: JSON.stringify(d.data),
      note: '',
      observed_at: observedAt,
      recorded_by: d.by,
      severity: observationSeverity(d.kind, d.data as never),
      status: 'closed',
      closed_at: `${PREVIOUS}-12-15T16:00:00Z`,
      payload_sha256: hash({ id, blockId: blockId(d.block), row: d.row, position: d.position, kind: d.kind, data: d.data, note: '', observedAt }),
      received_at: observedAt,
      updated_at: observedAt,
    });
  }
  for (let i = 0; i < observations.length; i += 1000) {
    await knex('observations')
      .insert(observations.slice(i, i + 1000))
      .onConflict('id')
      .ignore();
  }

  // Prunings weighed on Creek Flat's pruning records, both winters (the season seed's and the one above).
  const creek = blockId('Creek Flat');
  const recorded: { row: number; position: number; season: number; weightKg: number }[] = await knex('observations')
    .where({ organisation_id: organisationId, block_id: creek, kind: 'pruning-record' })
    .whereNull('deleted_at')
    .whereRaw(`jsonb_typeof(data->'pruningWeightKg') = 'number'`)
    .orderBy(['row_number', 'position', 'observed_at'])
    .select({
      row: 'row_number',
      position: 'position',
      season: knex.raw(`extract(year from observed_at at time zone 'UTC')::int`),
      weightKg: knex.raw(`(data->>'pruningWeightKg')::float8`),
    });

  const measurements = [...creekFlatHarvests(recorded), ...rowSamples()].map((m) => ({
    id: demoId(`measurement:${m.key}`),
    organisation_id: organisationId,
    block_id: blockId(m.block),
    kind: m.kind,
    row_number: m.row,
    position: m.position,
    position_id: m.position === null ? null : (slotAt.get(`${blockId(m.block)}:${m.row}:${m.position}`) ?? null),
    vines: m.vines,
    weight_kg: m.weightKg,
    clusters: m.clusters,
    measured_on: m.day,
    note: m.note ?? '',
    recorded_by: m.kind === 'yield' ? user('manager') : user('pruner'),
    created_at: `${m.day}T17:00:00Z`,
  }));
  const kept = measurements.filter((m) => m.position === null || m.position_id !== null);
  for (let i = 0; i < kept.length; i += 1000)
    await knex('measurements')
      .insert(kept.slice(i, i + 1000))
      .onConflict('id')
      .ignore();
}
