import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { codeWords, stringsIn } from '../helpers/code-words';
import { Client } from '../helpers/http';

/** What a reader sees of a page: the HTML without its scripts, styles and tags, entities read. */
function pageText(html: string) {
  const body = html
    .replace(/<script[\s\S]*?<\/script>/g, ' ')
    .replace(/<style[\s\S]*?<\/style>/g, ' ')
    .replace(/<head[\s\S]*?<\/head>/, ' ');
  return body
    .replace(/<[^>]+>/g, ' ')
    .replace(/&#x27;|&#39;/g, "'")
    .replace(/&quot;/g, '"')
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&')
    .replace(/\s+/g, ' ');
}

afterAll(closeTestDb);

/**
 * A hand-built block of 3 rows × 10 vines, with a season (2024) of known records and a little of
 * the season before. Every expected figure below is worked out here from the records, with the
 * published formulas written out, not by calling lib/viticulture.
 */
const SEASON = 2024;
const LB_KG = 0.45359237;
const Z95 = 1.959963984540054;

function wilson(k: number, n: number) {
  const p = k / n;
  const d = 1 + (Z95 * Z95) / n;
  const centre = (p + (Z95 * Z95) / (2 * n)) / d;
  const half = (Z95 * Math.sqrt((p * (1 - p)) / n + (Z95 * Z95) / (4 * n * n))) / d;
  return { estimate: p, lower: k === 0 ? 0 : centre - half, upper: k === n ? 1 : centre + half };
}

/** Vinifera 20 + 20 per pound of prunings, rounded down. */
const balancedBuds = (kg: number) => Math.floor(20 + 20 * (kg / LB_KG - 1));

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string };
let manager: Client;
let advisor: Client;
const ids: Record<string, string> = {};

async function as(email: string) {
  const client = new Client();
  await client.signIn(email, PASSWORD);
  return client;
}

async function record(client: Client, name: string, row: number, position: number, kind: string, data: object, day: string, note = '') {
  const id = randomUUID();
  ids[name] = id;
  const res = await client.json('/api/sync', 'POST', {
    observations: [{ id, blockId: block.id, row, position, kind, data, note, observedAt: `${day}T09:00:00Z` }],
  });
  expect((await res.json()).results[0], name).toMatchObject({ status: 'created' });
}

async function weigh(client: Client, body: object) {
  const res = await client.json('/api/measurements', 'POST', { blockId: block.id, weightUnit: 'kg', ...body });
  expect(res.status, await res.clone().text()).toBe(201);
}

const budbreak = (retained: number, pushed: number) => ({ budsRetained: retained, budsPushed: pushed });

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 10 });
  const db = testDb();
  await db('vine_positions').where({ block_id: block.id, row_number: 3, position: 10 }).update({ status: 'missing' });
  await db('vine_positions').where({ block_id: block.id, row_number: 3, position: 9 }).update({ status: 'replant', replant_year: 2023 });
  await db('vine_positions').where({ block_id: block.id, row_number: 3, position: 8 }).update({ status: 'replant', replant_year: 2021 });
  const gap = await db('vine_positions').where({ block_id: block.id, row_number: 3, position: 10 }).first('id');
  await db('vines').insert({ position_id: gap.id, planting_year: 2012, clone: 'X-1', rootstock: '110R', removed_year: 2023, removal_reason: 'dead' });

  const [scout, pruner] = [await as(team.scout.email), await as(team.pruner.email)];
  manager = await as(team.manager.email);
  advisor = await as(team.advisor.email);

  // Budbreak: vine 1/1 was checked twice; its latest check (27 of 28) is the one that counts there.
  await record(scout, 'r1v1-early', 1, 1, 'weak-budbreak', budbreak(28, 10), '2024-04-12');
  await record(scout, 'r1v1', 1, 1, 'weak-budbreak', budbreak(28, 27), '2024-04-26');
  await record(scout, 'r1v2', 1, 2, 'weak-budbreak', budbreak(28, 20), '2024-04-26');
  await record(scout, 'r1v3', 1, 3, 'weak-budbreak', budbreak(20, 3), '2024-04-26');
  await record(scout, 'r2v1', 2, 1, 'weak-budbreak', budbreak(30, 24), '2024-04-27');
  await record(scout, 'r2v2', 2, 2, 'weak-budbreak', budbreak(28, 11), '2024-04-27');
  await record(scout, 'r3v1', 3, 1, 'weak-budbreak', budbreak(24, 24), '2024-04-27');
  await record(scout, 'r3v2-deleted', 3, 2, 'weak-budbreak', budbreak(28, 5), '2024-04-27');
  // Trunks, holes, canes and a note.
  await record(pruner, 'r1v2-trunk', 1, 2, 'trunk-injury', { cause: 'mechanical', severity: 'severe', girdlingPercent: 60 }, '2024-02-10');
  await record(pruner, 'r3v5-trunk', 3, 5, 'trunk-injury', { cause: 'cold', severity: 'light', girdlingPercent: 5 }, '2024-02-10');
  await record(pruner, 'r2v9-trunk', 2, 9, 'trunk-injury', { cause: 'mechanical', severity: 'moderate', girdlingPercent: 30 }, '2024-02-10');
  await record(scout, 'r2v9-dead', 2, 9, 'missing-vine', { state: 'dead' }, '2024-06-01');
  await record(scout, 'r3v10', 3, 10, 'missing-vine', { state: 'missing' }, '2024-03-01');
  await record(manager, 'r2v3-note', 2, 3, 'note', {}, '2024-05-01', 'Drip line checked');
  await record(pruner, 'r1v1-cane-a', 1, 1, 'cane-diameter', { diameterMm: 9.5, exposure: 'sun', colourGood: true }, '2024-01-20');
  await record(pruner, 'r1v1-cane-b', 1, 1, 'cane-diameter', { diameterMm: 5.5, exposure: 'sun', colourGood: true }, '2024-01-20');
  await record(scout, 'r2v5-shade', 2, 5, 'shade-cane', { longestInternodeMm: 140, exposure: 'shade', colourGood: false, diameterMm: 7 }, '2024-11-20');
  // Winter bud injury: 7 + 9 dead of 40 buds cut.
  await record(scout, 'r1v4-buds', 1, 4, 'bud-injury', { budsCut: 20, primariesDead: 7 }, '2024-01-08');
  await record(scout, 'r2v4-buds', 2, 4, 'bud-injury', { budsCut: 20, primariesDead: 9 }, '2024-01-08');
  // Pruning records: 2 × 12 + 2 spurs = 28 buds (1.0 kg on the record); 2 × 14 + 1 = 30 (0.8 kg weighed
  // as a vine entry); 2 × 10 + 2 = 24 (row 3's sample: 9 kg over 10 vines).
  await record(pruner, 'r1v1-pruning', 1, 1, 'pruning-record', { canesKept: 2, budsPerCane: 12, renewalSpurs: 2, pruningWeightKg: 1 }, '2024-01-22');
  await record(pruner, 'r2v1-pruning', 2, 1, 'pruning-record', { canesKept: 2, budsPerCane: 14, renewalSpurs: 1 }, '2024-01-22');
  await record(pruner, 'r3v1-pruning', 3, 1, 'pruning-record', { canesKept: 2, budsPerCane: 10, renewalSpurs: 2 }, '2024-01-22');
  // The manager checks the pruner's work on vine 1/1: 34 buds on 2 canes + 2 renewal spurs = 38 against 28, 36% over.
  await record(
    manager,
    'r1v1-check',
    1,
    1,
    'pruning-check',
    { prunedBy: team.pruner.id, canesKept: 2, budsOnCanes: 34, renewalSpurs: 2, budTarget: 28 },
    '2024-01-23',
  );
  await weigh(pruner, { kind: 'pruning-weight', row: 2, position: 1, weight: 0.8, measuredOn: '2024-01-22' });
  await weigh(pruner, { kind: 'pruning-weight', row: 3, vines: 10, weight: 9, measuredOn: '2024-01-23' });
  // The 2024 harvest on vine 1/1, and that vine's wood weighed at the 2025 pruning: Ravaz 6 / 0.75.
  await weigh(manager, { kind: 'yield', row: 1, position: 1, weight: 6, clusters: 50, measuredOn: '2024-09-20' });
  await weigh(pruner, { kind: 'pruning-weight', row: 1, position: 1, weight: 0.75, measuredOn: '2025-01-25' });

  // The season before: the same trunk and the same weak vine, and one vine fine then.
  await record(pruner, 'r1v2-trunk-2023', 1, 2, 'trunk-injury', { cause: 'mechanical', severity: 'moderate', girdlingPercent: 20 }, '2023-11-10');
  await record(scout, 'r1v3-2023', 1, 3, 'weak-budbreak', budbreak(28, 14), '2023-04-25');
  await record(scout, 'r3v1-2023', 3, 1, 'weak-budbreak', budbreak(28, 27), '2023-04-25');

  await db('observations').where({ id: ids['r3v2-deleted'] }).update({ deleted_at: db.fn.now() });
  await db('observations').where({ id: ids['r2v9-trunk'] }).update({ status: 'closed', closed_at: db.fn.now() });
});

async function report(query = '', client = manager) {
  const res = await client.fetch(`/api/reports/blocks/${block.id}?season=${SEASON}${query}`);
  expect(res.status, await res.clone().text()).toBe(200);
  return res.json();
}

describe('GET /api/reports/blocks/:blockId', () => {
  it('counts incidence per finding kind over the vines scouted, with Wilson bounds, closed records in, deleted ones and records of the work out', async () => {
    const { report: r } = await report();
    // Vines with a live 2024 record other than a missing-vine one: r1 v1–v4, r2 v1–v5 and v9, r3 v1 and v5.
    expect(r.scouting.vinesScouted).toBe(12);
    const kinds = Object.fromEntries(r.incidence.kinds.map((k: { kind: string }) => [k.kind, k]));
    // Worst of the season per vine: vine 1/1's early check (36%) makes it a weak-budbreak vine here.
    const expected: Record<string, [number, number]> = {
      'weak-budbreak': [4, 12], // r1v1, r1v2 (71%), r1v3 (15%), r2v2 (39%)
      'trunk-injury': [3, 12], // r1v2, r3v5, r2v9 (closed, still this season's)
      'bud-injury': [2, 12], // 35% and 45% kill
      'shade-cane': [1, 12],
      'cane-diameter': [1, 12], // the 5.5 mm cane is thin
      // Not 'pruning-record' (r1v1 kept 28 buds against a target of 44) nor 'pruning-check': records of the work, not problems.
      'missing-vine': [2, 30], // r2v9, r3v10, out of the block's 30 slots
    };
    expect(Object.keys(kinds).sort()).toEqual(Object.keys(expected).sort());
    for (const [kind, [affected, outOf]] of Object.entries(expected)) {
      const w = wilson(affected, outOf);
      expect([kinds[kind].vinesAffected, kinds[kind].outOf], kind).toEqual([affected, outOf]);
      expect(kinds[kind].incidence.estimate, kind).toBeCloseTo(w.estimate, 12);
      expect(kinds[kind].incidence.lower, kind).toBeCloseTo(w.lower, 12);
      expect(kinds[kind].incidence.upper, kind).toBeCloseTo(w.upper, 12);
    }
  });

  it('gives each row its own incidence over the vines scouted in it, and over its slots for missing vines', async () => {
    const { report: r } = await report();
    const rows = Object.fromEntries(r.incidence.rows.map((row: { row: number }) => [row.row, row]));
    expect([rows[1].vinesScouted, rows[2].vinesScouted, rows[3].vinesScouted]).toEqual([4, 6, 2]);
    expect(rows[1].kinds['weak-budbreak'].affected).toBe(3);
    expect(rows[1].kinds['weak-budbreak'].incidence.lower).toBeCloseTo(wilson(3, 4).lower, 12);
    expect(rows[2].kinds['trunk-injury'].incidence.upper).toBeCloseTo(wilson(1, 6).upper, 12);
    expect(rows[3].kinds['missing-vine']).toMatchObject({ affected: 1, outOf: 10 });
    expect(rows[3].kinds['missing-vine'].incidence.upper).toBeCloseTo(wilson(1, 10).upper, 12);
  });

  it('reads budbreak from each vine’s latest check: the pooled share, the weak share and its interval', async () => {
    const { report: r } = await report();
    const retained = 28 + 28 + 20 + 30 + 28 + 24;
    const pushed = 27 + 20 + 3 + 24 + 11 + 24;
    expect(r.budbreak.vinesChecked).toBe(6);
    expect(r.budbreak.pooled.value).toBeCloseTo((pushed / retained) * 100, 12);
    expect(r.budbreak.weakVines).toBe(3);
    expect(r.budbreak.weakShare.lower).toBeCloseTo(wilson(3, 6).lower, 12);
    expect(r.budbreak.weakShare.upper).toBeCloseTo(wilson(3, 6).upper, 12);
    expect(r.budbreak.histogram.map((h: { count: number }) => h.count)).toEqual([0, 1, 0, 1, 0, 0, 0, 1, 1, 2]);
    expect(r.budbreak.pooled.how).toBe(
      `${pushed} of ${retained} buds retained pushed a shoot: ${pushed} ÷ ${retained} × 100 = ${(Math.round((pushed / retained) * 1000) / 10).toString()}%`,
    );
  });

  it('sets buds kept against the balanced-pruning target from the record’s, the vine’s or the row sample’s weight', async () => {
    const { report: r } = await report();
    const vines = Object.fromEntries(r.budLoad.vines.map((v: { row: number; position: number }) => [`${v.row}:${v.position}`, v]));
    expect(vines['1:1']).toMatchObject({ kept: 28, weightKg: 1, weightSource: 'record', target: balancedBuds(1) });
    expect(vines['2:1']).toMatchObject({ kept: 30, weightKg: 0.8, weightSource: 'vine', target: balancedBuds(0.8) });
    expect(vines['3:1']).toMatchObject({ kept: 24, weightSource: 'row-sample', target: balancedBuds(0.9) });
    expect(vines['3:1'].weightKg).toBeCloseTo(0.9, 12);
    expect(r.budLoad.meanKept.value).toBeCloseTo(82 / 3, 12);
    expect(r.budLoad.meanTarget.value).toBeCloseTo((balancedBuds(1) + balancedBuds(0.8) + balancedBuds(0.9)) / 3, 12);
  });

  it('adjusts the bud target for winter injury by the share of primary buds dead', async () => {
    const { report: r } = await report();
    expect(r.budInjury.kill.value).toBeCloseTo(40, 12);
    const target = Math.round((balancedBuds(1) + balancedBuds(0.8) + balancedBuds(0.9)) / 3);
    expect(r.budInjury.target.value).toBe(target);
    // 20–80% dead: leave that percentage more buds, rounded half up.
    expect(r.budInjury.adjusted).toMatchObject({ buds: Math.floor(target * 1.4 + 0.5), advice: 'leave-extra' });
  });

  it('pairs the harvest with the next winter’s prunings for the Ravaz index', async () => {
    const { report: r } = await report();
    expect(r.ravaz.vintage).toBe(2024);
    expect(r.ravaz.index.value).toBeCloseTo(6 / 0.75, 12);
    expect(r.ravaz.reading).toBe('balanced');
    expect(r.harvest.clusterWeightG.value).toBeCloseTo(6000 / 50, 12);
  });

  it('reads the Ravaz index against the grape type asked for: 8 is balanced vinifera but under-cropped Concord (Bates, "Vine Size: Magic Number 15")', async () => {
    const { report: r } = await report('&grapeType=concord');
    expect(r.ravaz.index.value).toBeCloseTo(8, 12);
    expect(r.ravaz).toMatchObject({ reading: 'under-cropped', range: { underBelow: 10, overAbove: 20 } });
    expect(r.ravaz.rangeSource).toMatch(/Magic Number 15/);
    // The Concord formula and range go together: 30 + 10 for the bud targets.
    expect(r.budLoad.formula).toMatchObject({ firstUnitBuds: 30, perAdditionalUnitBuds: 10, grapeType: 'concord' });
  });

  it('checks the bud load per foot of row, sizes the yield sample from vine yields, and takes counted clusters and lag-phase weights', async () => {
    const { report: r } = await report('&clustersPerVine=40&lagClusterWeightG=55');
    // 27.3 buds kept on 1.2 m (3.94 ft) of row: 6.9 a foot, over Ohio State's 4–6 (16–24 a vine at this spacing).
    expect(r.budLoad.density.kept.budsPerFt).toBeCloseTo(27.33333 / (1.2 / 0.3048), 4);
    expect(r.budLoad.density.kept.rangePerVine).toEqual({ min: 16, max: 24 });
    expect(r.budLoad.density.warning).toMatch(/above the 4–6 a foot/);
    // One single-vine yield only: the default CV of 30% at ±10%, corrected for 28 bearing vines: 34.57 / (1 + 33.57 / 28) = 15.7 → 16.
    expect(r.crop.sampling).toMatchObject({ cvPercent: 30, marginPercent: 10, vines: 16 });
    // 28 vines × 40 clusters × 55 g × 2 (University of Maryland Extension).
    expect(r.crop.estimate.kg).toBeCloseTo((28 * 40 * 110) / 1000, 9);
    expect(r.crop.inputs.clustersPerVine).toMatchObject({ value: 40, source: 'entered' });
    expect(r.crop.restsOn).toBe('clusters counted per vine 40: entered; cluster weight at lag phase 55: entered');
    // Without them, the budbreak rests on every count of the season: 6 live vines' latest checks, weak or not.
    const { report: plain } = await report();
    expect(plain.crop.restsOn).toMatch(/budbreak 69: 109 of 158 buds pushed over every budbreak count of 2024: 6 vines, 3 of them weak/);
  });

  it('estimates the crop and the pruning labour from the block, with the inputs shown and their sources', async () => {
    const { report: r } = await report();
    // 27 planted + the replant of 2021 (bearing by 2024); the 2023 replant is too young; 1 missing.
    expect(r.crop.basis.vines).toBe(28);
    expect(r.crop.inputs.budsPerVine).toMatchObject({ value: 27.3, source: 'mean buds kept on 3 pruning records' });
    expect(r.crop.inputs.budbreakPercent.value).toBe(69);
    expect(r.crop.inputs.clustersPerShoot).toMatchObject({ value: 1.5, source: expect.stringMatching(/^default/) });
    expect(r.crop.inputs.clusterWeightG.value).toBe(100);
    expect(r.crop.estimate.kg).toBeCloseTo((28 * 27.3 * 0.69 * 1.5 * 100) / 1000, 9);
    // 30 slots of 2.5 m × 1.2 m.
    expect(r.crop.estimate.tonnesPerHa).toBeCloseTo(r.crop.estimate.kg / 1000 / (90 / 10000), 9);
    // 29 standing vines, cane-pruned at 1.75 minutes, 25 an hour.
    expect(r.labour.estimate.hours).toBeCloseTo((29 * 1.75) / 60, 12);
    expect(r.labour.estimate.cost).toBeCloseTo(((29 * 1.75) / 60) * 25, 12);
  });

  it('recomputes the estimates with the inputs given in the address', async () => {
    const { report: r } = await report('&clustersPerShoot=2&clusterWeightG=120&minutesPerVine=2.5&hourlyCost=30&budsPerVine=30&budbreakPercent=80');
    expect(r.crop.estimate.kg).toBeCloseTo((28 * 30 * 0.8 * 2 * 120) / 1000, 9);
    expect(r.crop.inputs.clusterWeightG).toMatchObject({ value: 120, source: 'entered', defaultValue: 100 });
    expect(r.labour.estimate.hours).toBeCloseTo((29 * 2.5) / 60, 12);
    expect(r.labour.estimate.cost).toBeCloseTo(((29 * 2.5) / 60) * 30, 12);
  });

  it('lists the vines to replant by clone and rootstock, from holes and from vines recorded dead', async () => {
    const { report: r } = await report();
    expect(r.replant.total).toBe(2);
    expect(r.replant.byRow).toEqual([
      { row: 2, positions: [9] },
      { row: 3, positions: [10] },
    ]);
    expect(r.replant.byStock).toEqual(
      expect.arrayContaining([
        { clone: 'X-1', rootstock: '110R', vines: 1 },
        { clone: 'clone not recorded', rootstock: 'rootstock not recorded', vines: 1 },
      ]),
    );
  });

  it('shows the season’s tasks, open and done, when the server keeps tasks', async () => {
    const db = testDb();
    const hasTasks = (await db.raw(`select to_regclass('public.tasks') is not null as ok`)).rows[0].ok as boolean;
    if (hasTasks) {
      const [open] = await db('tasks')
        .insert({
          organisation_id: team.org.id,
          block_id: block.id,
          title: 'Renew trunk 1/2',
          assignee_id: team.pruner.id,
          status: 'open',
          created_at: '2024-02-12T08:00:00Z',
        })
        .returning('id');
      await db('tasks').insert({
        organisation_id: team.org.id,
        block_id: block.id,
        title: 'Replant row 3',
        status: 'done',
        created_at: '2024-03-02T08:00:00Z',
        closed_at: '2024-04-01T08:00:00Z',
      });
      await db('tasks').insert({ organisation_id: team.org.id, block_id: block.id, title: 'Next year', status: 'open', created_at: '2025-03-02T08:00:00Z' });
      const slot = await db('vine_positions').where({ block_id: block.id, row_number: 1, position: 2 }).first('id');
      await db('task_items').insert({ task_id: open.id, position_id: slot.id, row_number: 1, position: 2, sequence: 1, status: 'done' });
    }
    const { report: r } = await report();
    expect(r.tasks.available).toBe(hasTasks);
    if (hasTasks) {
      expect(r.tasks).toMatchObject({ open: 1, done: 1 });
      expect(r.tasks.list.map((t: { title: string; itemsDone: number; items: number }) => [t.title, t.itemsDone, t.items])).toEqual([
        ['Renew trunk 1/2', 1, 1],
        ['Replant row 3', 0, 0],
      ]);
    }
  });

  it('sets the season before beside it and lists the vines whose problems persisted', async () => {
    const { comparison } = await report();
    expect(comparison.previous).toBe(2023);
    expect(comparison.rows.find((row: { label: string }) => row.label === 'Vines scouted')).toMatchObject({ before: 3, now: 12 });
    expect(comparison.persisted.total).toBe(2);
    expect(comparison.persisted.vines).toEqual([
      { row: 1, position: 2, kind: 'trunk-injury', before: 2, now: 3 },
      { row: 1, position: 3, kind: 'weak-budbreak', before: 1, now: 3 },
    ]);
    const none = await report('&compare=none');
    expect(none.comparison).toBeNull();
  });

  it('lets an advisor read the report, and lists the seasons with records', async () => {
    const { seasons } = await report('', advisor);
    expect(seasons).toEqual([2025, 2024, 2023]);
  });

  it('reports the pruning check as buds left against the crew’s target, and the pruning records as canes and spurs kept', async () => {
    const { report: r } = await report();
    expect(r.incidence.kinds.map((k: { kind: string }) => k.kind)).not.toContain('pruning-check');
    expect(r.pruningChecks).toMatchObject({ checks: 1, pruners: 1, withTarget: 1, within: 0, over: 1, under: 0, meanTarget: 28 });
    expect(r.pruningChecks.meanLeft.value).toBe(38);
    expect(r.pruningChecks.kept).toEqual({ canes: 2, budsOnCanes: 34, renewalSpurs: 2 });
    // Pruning records: (2 + 2 + 2) / 3 canes, (12 + 14 + 10) / 3 buds a cane, (2 + 1 + 2) / 3 renewal spurs.
    expect(r.budLoad.kept.canes).toBe(2);
    expect(r.budLoad.kept.budsPerCane).toBeCloseTo(12, 12);
    expect(r.budLoad.kept.renewalSpurs).toBeCloseTo(5 / 3, 12);
  });

  it('says every figure in words on the page a manager reads: no calls, settings paths or arrows', async () => {
    const res = await manager.fetch(`/reports/${block.id}?season=${SEASON}`);
    expect(res.status).toBe(200);
    const text = pageText(await res.text());
    // The page itself, with its working: the sections are there before the check means anything.
    expect(text).toContain('Contents');
    expect(text).toContain('How this is worked out');
    expect(text).toMatch(/buds retained pushed a shoot: \d+ ÷ \d+ × 100 = /);
    expect(text).toMatch(/29 vines × 1\.75 min = 0\.8 h; at 25 an hour, 21/);
    expect(codeWords(text)).toEqual([]);
    const { report: r } = await report();
    expect(
      stringsIn(r)
        .filter(({ path }) => !/\.missing\[/.test(path))
        .flatMap(({ path, text: t }) => codeWords(t).map((w) => `${path}: ${w}`)),
    ).toEqual([]);
  });

  it('answers 404 for another organisation’s block or a malformed id, 401 when signed out, and 422 for an input it cannot read', async () => {
    const other = await makeTeam();
    const otherBlock = await makeBlock(other.org.id);
    expect((await manager.fetch(`/api/reports/blocks/${otherBlock.id}`)).status).toBe(404);
    expect((await manager.fetch('/api/reports/blocks/not-a-uuid')).status).toBe(422);
    expect((await new Client().fetch(`/api/reports/blocks/${block.id}`)).status).toBe(401);
    for (const [query, field] of [
      ['clusterWeightG=-1', 'clusterWeightG'],
      ['clustersPerVine=-3', 'clustersPerVine'],
      ['lagClusterWeightG=heavy', 'lagClusterWeightG'],
      ['season=twenty', 'season'],
      ['grapeType=muscat', 'grapeType'],
      ['budTarget=1.5', 'budTarget'],
      ['colour=red', '_'],
    ] as const) {
      const res = await manager.fetch(`/api/reports/blocks/${block.id}?${query}`);
      expect(res.status, query).toBe(422);
      const { error } = await res.json();
      expect(error.code).toBe('invalid-input');
      expect(Object.keys(error.fields), query).toEqual([field]);
    }
  });
});

describe('GET /api/reports', () => {
  it('sets every block of the organisation side by side, and only that organisation’s', async () => {
    const res = await manager.fetch(`/api/reports?season=${SEASON}`);
    expect(res.status).toBe(200);
    const estate = await res.json();
    expect(estate.blocks.map((b: { block: { id: string } }) => b.block.id)).toEqual([block.id]);
    const trunk = estate.kinds.find((k: { kind: string }) => k.kind === 'trunk-injury');
    expect(trunk.incidence.upper).toBeCloseTo(wilson(3, 12).upper, 12);
    expect(estate.totals.replant).toBe(2);
  });
});
