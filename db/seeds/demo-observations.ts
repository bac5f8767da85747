/**
 * An invented season on the demo estate, with patterns worth finding on the grid: weak budbreak
 * pooling in the low corner of Creek Flat, tractor damage to trunks along its headland row, shade
 * canes on the side by the tree line, scattered missing and dead vines, hail-bruised canes on Upper
 * Terrace, cold-injured buds at the foot of Schoolhouse Slope, and patchy budbreak in the young North
 * Bench. Each vine's figures come from a fixed pseudo-random sequence and every id is derived from
 * the record's meaning, so a second run inserts nothing new. Severity is lib/viticulture's, as the
 * server computes it. A few dozen drawn (not photographed) JPEGs go to the bucket with their thumbnails.
 */
import { createHash } from 'node:crypto';
import { HeadObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import type { Knex } from 'knex';
import sharp from 'sharp';
import { escapeHtml } from '../../lib/html';
import { photoKey, THUMB_LONG_SIDE, THUMB_QUALITY, thumbKey } from '../../lib/storage-keys';
import { balancedPruningBuds, BALANCED_PRUNING_FORMULAS, observationSeverity, type ObservationData, type ObservationKind } from '../../lib/viticulture';
import { DEMO_USERS } from './demo';
import { DEMO_BLOCKS, type DemoBlock } from './demo-layout';

export interface DemoObservationOptions {
  /** Where the S3 settings come from; without them the photos are skipped. */
  env?: NodeJS.ProcessEnv;
}

// Read when the seed runs, not at import: demo.ts imports this module.
const demoUser = (role: 'manager' | 'scout' | 'pruner') => DEMO_USERS.find((u) => u.role === role)!.id;
let SCOUT = '';
let PRUNER = '';
let MANAGER = '';

interface Draft {
  key: string;
  block: DemoBlock;
  row: number;
  position: number;
  kind: ObservationKind;
  data: ObservationData;
  note?: string;
  day: string;
  by: string;
  closedOn?: string;
  photo?: boolean;
}

interface Slot {
  id: string;
  row: number;
  position: number;
  status: 'planted' | 'missing' | 'dead' | 'replant';
}

/** mulberry32: a small seeded generator, so every run draws the same estate. */
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

/** A UUID v4 derived from a name: the same record gets the same id on every run. */
export function demoId(name: string) {
  const h = createHash('sha256').update(`vineward-demo:${name}`).digest('hex');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-${((parseInt(h[16]!, 16) & 3) | 8).toString(16)}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

function addDays(isoDay: string, days: number) {
  const d = new Date(`${isoDay}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** A time during the working day. */
function at(isoDay: string, rand: () => number) {
  const minutes = 7 * 60 + Math.floor(rand() * 9 * 60);
  return `${isoDay}T${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}:00Z`;
}

const pick = <T>(rand: () => number, items: readonly T[]) => items[Math.floor(rand() * items.length)]!;
const between = (rand: () => number, lo: number, hi: number) => lo + rand() * (hi - lo);
const round1 = (n: number) => Math.round(n * 10) / 10;

function byName(name: string) {
  const block = DEMO_BLOCKS.find((b) => b.name === name);
  if (!block) throw new Error(`demo block ${name} is missing from demo-layout.ts`);
  return block;
}

function rowLength(block: DemoBlock, row: number) {
  return block.shortRows?.[row] ?? block.vinesPerRow;
}

function pruningRecord(rand: () => number, weightKg: number) {
  const target = balancedPruningBuds(weightKg, BALANCED_PRUNING_FORMULAS.vinifera, 'kg');
  // Most pruners land near the target; a few leave far too many or too few buds.
  const slip = rand() < 0.85 ? Math.round(between(rand, -2, 2)) : Math.round(between(rand, -8, 10));
  const budsPerCane = Math.max(6, Math.round((target - 4) / 2) + slip);
  return { canesKept: 2, budsPerCane, renewalSpurs: 2, pruningWeightKg: round1(weightKg) };
}

function creekFlat(out: Draft[]) {
  const block = byName('Creek Flat');
  const rand = random(2);
  const { rowCount } = block;

  // Budbreak check in spring: the low corner (last rows, creek end) holds cold air and water.
  for (let row = 105; row <= rowCount; row++) {
    for (let position = 1; position <= 50; position += 2) {
      const distance = Math.hypot(rowCount - row, position - 1);
      const base = Math.min(92, 12 + distance * 1.9);
      const percent = Math.max(0, Math.min(100, base + between(rand, -12, 12)));
      const retained = 28 + Math.floor(rand() * 5);
      const pushed = Math.round((retained * percent) / 100);
      out.push({
        key: `cf:budbreak:${row}:${position}`,
        block,
        row,
        position,
        kind: 'weak-budbreak',
        data: { budsRetained: retained, budsPushed: pushed },
        day: addDays('2026-04-22', Math.floor((rowCount - row) / 8)),
        by: SCOUT,
        photo: distance < 9 && position % 4 === 1,
      });
    }
  }
  // The same check on a spread sample of the rest of the block, for comparison.
  for (let row = 5; row < 105; row += 10) {
    for (let position = 5; position <= 150; position += 10) {
      const retained = 28 + Math.floor(rand() * 5);
      const percent = rand() < 0.06 ? between(rand, 55, 74) : between(rand, 78, 97);
      out.push({
        key: `cf:budbreak-sample:${row}:${position}`,
        block,
        row,
        position,
        kind: 'weak-budbreak',
        data: { budsRetained: retained, budsPushed: Math.round((retained * percent) / 100) },
        day: '2026-04-28',
        by: SCOUT,
      });
    }
  }

  // Trunk injury along the headland row, where the mower and sprayer turn. Vines 3 and 9 are the
  // worst, nearest the track, so they are the first red cells on the grid.
  for (const row of [1, 2]) {
    for (let position = 1; position <= 150; position++) {
      const forced = row === 1 && (position === 3 || position === 9);
      if (!forced && rand() > (row === 1 ? 0.38 : 0.08)) continue;
      const severity = forced ? 'severe' : pick(rand, ['light', 'light', 'moderate', 'moderate', 'severe'] as const);
      const girdling = Math.round(severity === 'severe' ? between(rand, 45, 80) : severity === 'moderate' ? between(rand, 15, 40) : between(rand, 0, 15));
      const earlier = !forced && rand() < 0.2;
      const data = { cause: 'mechanical' as const, severity, girdlingPercent: girdling };
      out.push({
        key: `cf:trunk:${row}:${position}`,
        block,
        row,
        position,
        kind: 'trunk-injury',
        data,
        day: earlier ? addDays('2026-01-19', position % 9) : addDays('2026-11-16', position % 10),
        by: PRUNER,
        note:
          severity === 'severe'
            ? pick(rand, ['Bark torn back to the wood on the track side.', 'Mower strike, wound weeping.', 'Deep scrape low on the trunk.'])
            : '',
        closedOn: earlier ? '2026-03-02' : undefined,
        photo: !earlier && observationSeverity('trunk-injury', data) === 3,
      });
    }
  }

  // Shade canes on the side by the tree line (far end of rows 30–90).
  for (let row = 30; row <= 90; row++) {
    for (let position = 118; position <= 150; position++) {
      const depth = (position - 118) / 32;
      if (rand() > 0.12 + depth * 0.35) continue;
      const data = {
        longestInternodeMm: Math.round(between(rand, 95, 170)),
        exposure: rand() < 0.6 + depth * 0.3 ? ('shade' as const) : ('partial' as const),
        colourGood: rand() < 0.45,
        diameterMm: round1(between(rand, 6, 9.5)),
      };
      out.push({
        key: `cf:shade:${row}:${position}`,
        block,
        row,
        position,
        kind: 'shade-cane',
        data,
        day: addDays('2026-11-20', row % 6),
        by: SCOUT,
        photo: row % 15 === 0 && position === 150,
      });
    }
  }

  // Pruning records and cane measurements on every tenth row, as the crew lead spot-checks.
  for (let row = 3; row <= rowCount; row += 10) {
    for (let position = 2; position <= 150; position += 3) {
      out.push({
        key: `cf:pruning:${row}:${position}`,
        block,
        row,
        position,
        kind: 'pruning-record',
        data: pruningRecord(rand, between(rand, 0.5, 1.3)),
        day: addDays('2026-01-26', Math.floor(row / 10)),
        by: PRUNER,
      });
      if (position % 9 !== 2) continue;
      const canes = 2 + Math.floor(rand() * 2);
      for (let cane = 1; cane <= canes; cane++) {
        out.push({
          key: `cf:cane:${row}:${position}:${cane}`,
          block,
          row,
          position,
          kind: 'cane-diameter',
          data: {
            diameterMm: round1(between(rand, 6.5, 12.5)),
            longestInternodeMm: Math.round(between(rand, 55, 115)),
            exposure: pick(rand, ['sun', 'sun', 'sun', 'partial'] as const),
            colourGood: rand() < 0.85,
          },
          day: addDays('2026-01-22', Math.floor(row / 10)),
          by: PRUNER,
        });
      }
    }
  }
}

/** Missing and dead slots as scouts found them; a replanted slot's old record is closed. */
function holes(out: Draft[], slotsByBlock: Map<string, Slot[]>) {
  for (const block of DEMO_BLOCKS) {
    const rand = random(block.rowCount * 1000 + block.vinesPerRow);
    for (const slot of slotsByBlock.get(block.id) ?? []) {
      if (slot.status === 'planted' || rand() > 0.7) continue;
      const state = slot.status === 'dead' ? 'dead' : 'missing';
      out.push({
        key: `hole:${block.id}:${slot.row}:${slot.position}`,
        block,
        row: slot.row,
        position: slot.position,
        kind: 'missing-vine',
        data: { state },
        day: addDays('2026-02-02', slot.row % 20),
        by: SCOUT,
        closedOn: slot.status === 'replant' ? '2026-04-10' : undefined,
        photo: block.name === 'Creek Flat' && slot.status === 'dead' && slot.row > 120 && rand() < 0.5,
      });
    }
  }
}

function otherBlocks(out: Draft[]) {
  const terrace = byName('Upper Terrace');
  let rand = random(11);
  // A hail strip across the middle rows bruised last season's canes.
  for (let row = 8; row <= 14; row++) {
    for (let position = 1; position <= rowLength(terrace, row); position++) {
      if (rand() > 0.45) continue;
      const severity = pick(rand, ['light', 'moderate', 'moderate', 'severe'] as const);
      out.push({
        key: `ut:hail:${row}:${position}`,
        block: terrace,
        row,
        position,
        kind: 'cane-injury',
        data: { cause: 'hail', canesAffected: 1 + Math.floor(rand() * 4), severity },
        day: addDays('2026-01-14', row - 8),
        by: SCOUT,
        photo: row === 11 && position % 15 === 0,
      });
    }
  }
  for (let row = 1; row <= terrace.rowCount; row += 2) {
    for (let position = 4; position <= rowLength(terrace, row); position += 6) {
      out.push({
        key: `ut:pruning:${row}:${position}`,
        block: terrace,
        row,
        position,
        kind: 'pruning-record',
        data: pruningRecord(rand, between(rand, 0.4, 1.1)),
        day: addDays('2026-02-03', row % 7),
        by: PRUNER,
      });
    }
  }

  // A spring budbreak count on a spread sample of vines, for the crop estimate: a count of weak vines
  // alone would understate the block. Its own sequence, so the records above and below stay as they were.
  const counts = random(53);
  for (let row = 2; row <= terrace.rowCount; row += 4) {
    for (let position = 5; position <= rowLength(terrace, row); position += 12) {
      const retained = 24 + Math.floor(counts() * 6);
      out.push({
        key: `ut:budbreak-sample:${row}:${position}`,
        block: terrace,
        row,
        position,
        kind: 'weak-budbreak',
        data: { budsRetained: retained, budsPushed: Math.round((retained * between(counts, 78, 96)) / 100) },
        day: addDays('2026-04-24', row % 3),
        by: SCOUT,
      });
    }
  }

  const slope = byName('Schoolhouse Slope');
  rand = random(23);
  // Cold air drains to the foot of the slope (vine 1 end): primary buds died there in January.
  for (let row = 1; row <= slope.rowCount; row += 2) {
    for (let position = 1; position <= 14; position++) {
      if (rand() > 0.55) continue;
      const budsCut = 20;
      const killed = Math.round(budsCut * Math.max(0, Math.min(1, between(rand, 0.9, 1.05) - position * 0.06)));
      out.push({
        key: `ss:bud:${row}:${position}`,
        block: slope,
        row,
        position,
        kind: 'bud-injury',
        data: { budsCut, primariesDead: killed },
        day: addDays('2026-01-06', row % 4),
        by: SCOUT,
        photo: row % 12 === 1 && position === 2,
      });
    }
  }

  // The same spring count up the slope, above the cold pocket, where the primaries came through.
  for (let row = 2; row <= slope.rowCount; row += 3) {
    for (let position = 10; position <= rowLength(slope, row); position += 8) {
      const retained = 22 + Math.floor(counts() * 6);
      out.push({
        key: `ss:budbreak-sample:${row}:${position}`,
        block: slope,
        row,
        position,
        kind: 'weak-budbreak',
        data: { budsRetained: retained, budsPushed: Math.round((retained * between(counts, 78, 94)) / 100) },
        day: addDays('2026-04-27', row % 3),
        by: SCOUT,
      });
    }
  }

  const bench = byName('North Bench');
  rand = random(37);
  // Young vines: budbreak is patchy where the drip line was blocked (scattered, not clustered).
  for (let row = 1; row <= bench.rowCount; row++) {
    for (let position = 1; position <= rowLength(bench, row); position++) {
      if (rand() > 0.16) continue;
      const retained = 14 + Math.floor(rand() * 6);
      const percent = rand() < 0.4 ? between(rand, 10, 60) : between(rand, 70, 100);
      out.push({
        key: `nb:budbreak:${row}:${position}`,
        block: bench,
        row,
        position,
        kind: 'weak-budbreak',
        data: { budsRetained: retained, budsPushed: Math.round((retained * percent) / 100) },
        day: addDays('2026-05-04', row % 5),
        by: SCOUT,
      });
    }
  }
  out.push({
    key: 'nb:note:1',
    block: bench,
    row: 6,
    position: 20,
    kind: 'note',
    data: {},
    day: '2026-05-06',
    by: MANAGER,
    note: 'Drip emitter blocked from here to the end of the row; flushed the line.',
  });
}

interface Photo {
  id: string;
  observationId: string;
  draft: Draft;
  observedAt: string;
}

const KIND_TITLES: Partial<Record<ObservationKind, string>> = {
  'trunk-injury': 'Trunk injury',
  'weak-budbreak': 'Weak budbreak',
  'shade-cane': 'Shade cane',
  'missing-vine': 'Missing or dead vine',
  'cane-injury': 'Cane injury',
  'bud-injury': 'Winter bud injury',
};

/** A drawing of the vine (no photograph): post, wire, trunk and canes, the kind's sign, and the address. */
function drawing(p: Photo) {
  const { draft } = p;
  const rand = random(parseInt(p.id.slice(0, 8), 16));
  const w = 960;
  const h = 720;
  const trunkX = 430 + rand() * 100;
  const parts: string[] = [
    `<rect width="${w}" height="${h}" fill="#dfe7ea"/>`,
    `<rect y="${h * 0.72}" width="${w}" height="${h * 0.28}" fill="#8a7a5c"/>`,
    `<rect x="90" y="160" width="22" height="${h * 0.72 - 160}" fill="#7b6a55"/>`,
    `<line x1="60" y1="300" x2="${w - 40}" y2="300" stroke="#5f5f5f" stroke-width="4"/>`,
  ];
  const missing = draft.kind === 'missing-vine';
  if (!missing) {
    parts.push(
      `<path d="M${trunkX} ${h * 0.74} C ${trunkX + 10} ${h * 0.6} ${trunkX - 14} ${h * 0.5} ${trunkX} 300" stroke="#5a3b22" stroke-width="38" fill="none" stroke-linecap="round"/>`,
    );
    const canes = draft.kind === 'shade-cane' ? 1 : 2;
    for (let c = 0; c < canes; c++) {
      const dir = c === 0 ? 1 : -1;
      const reach = draft.kind === 'shade-cane' ? 420 : 260 + rand() * 60;
      parts.push(
        `<path d="M${trunkX} 300 Q ${trunkX + dir * reach * 0.5} ${255 - rand() * 30} ${trunkX + dir * reach} 298" stroke="#8b5a2b" stroke-width="${draft.kind === 'shade-cane' ? 7 : 11}" fill="none"/>`,
      );
      const spacing = draft.kind === 'shade-cane' ? 70 : 32;
      for (let x = spacing; x < reach; x += spacing) {
        parts.push(`<circle cx="${trunkX + dir * x}" cy="${292 - Math.sin((x / reach) * Math.PI) * 28}" r="6" fill="#6b4420"/>`);
        if (draft.kind === 'weak-budbreak' && rand() < 0.3) {
          parts.push(`<path d="M${trunkX + dir * x} ${284 - Math.sin((x / reach) * Math.PI) * 28} l ${dir * 8} -40" stroke="#4f8a2e" stroke-width="6"/>`);
        }
      }
    }
    if (draft.kind === 'trunk-injury') {
      parts.push(`<ellipse cx="${trunkX + 6}" cy="${h * 0.64}" rx="16" ry="${34 + rand() * 24}" fill="#e9d8b4" stroke="#3b2412" stroke-width="3"/>`);
    }
    if (draft.kind === 'cane-injury' || draft.kind === 'bud-injury') {
      for (let i = 0; i < 6; i++) parts.push(`<circle cx="${trunkX - 200 + rand() * 400}" cy="${270 + rand() * 40}" r="5" fill="#2b2b2b"/>`);
    }
  } else {
    parts.push(`<rect x="${trunkX - 4}" y="230" width="8" height="${h * 0.74 - 230}" fill="#9c8a66"/>`);
  }
  const title = `${draft.block.name} · Row ${draft.row} · Vine ${draft.position}`;
  parts.push(
    `<rect x="24" y="24" width="${w - 48}" height="104" rx="12" fill="#ffffff" fill-opacity="0.88"/>`,
    `<text x="48" y="70" font-family="DejaVu Sans, sans-serif" font-size="38" font-weight="bold" fill="#1d1a16">${escapeHtml(title)}</text>`,
    `<text x="48" y="110" font-family="DejaVu Sans, sans-serif" font-size="26" fill="#4a443b">${escapeHtml(`${KIND_TITLES[draft.kind] ?? draft.kind} · ${p.observedAt.slice(0, 10)} · demo drawing`)}</text>`,
  );
  return Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}">${parts.join('')}</svg>`);
}

function s3From(env: NodeJS.ProcessEnv) {
  if (!env.S3_BUCKET || !env.S3_ACCESS_KEY_ID || !env.S3_SECRET_ACCESS_KEY) return null;
  const client = new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION ?? 'local',
    forcePathStyle: env.S3_FORCE_PATH_STYLE === '1' || env.S3_FORCE_PATH_STYLE === 'true',
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  return { client, bucket: env.S3_BUCKET };
}

async function exists(s3: NonNullable<ReturnType<typeof s3From>>, key: string) {
  try {
    await s3.client.send(new HeadObjectCommand({ Bucket: s3.bucket, Key: key }));
    return true;
  } catch {
    return false;
  }
}

async function seedPhotos(knex: Knex, organisationId: string, photos: Photo[], env: NodeJS.ProcessEnv) {
  const s3 = s3From(env);
  if (!s3) {
    console.warn('Demo photos skipped: no S3 settings were given to the seed.');
    return;
  }
  const known = new Set<string>(
    await knex('photos')
      .whereIn(
        'id',
        photos.map((p) => p.id),
      )
      .pluck('id'),
  );
  // Rows without objects (the bucket was emptied) get their objects back; objects are rewritten as needed.
  const todo = [];
  for (const p of photos) {
    if (!known.has(p.id) || !(await exists(s3, thumbKey(organisationId, p.id)))) todo.push(p);
  }
  const rows: Record<string, unknown>[] = [];
  const work = async (p: Photo) => {
    const original = await sharp(drawing(p)).jpeg({ quality: 78, mozjpeg: false }).toBuffer();
    const thumb = await sharp(original).resize(THUMB_LONG_SIDE, THUMB_LONG_SIDE, { fit: 'inside' }).jpeg({ quality: THUMB_QUALITY }).toBuffer();
    await Promise.all([
      s3.client.send(new PutObjectCommand({ Bucket: s3.bucket, Key: photoKey(organisationId, p.id), Body: original, ContentType: 'image/jpeg' })),
      s3.client.send(new PutObjectCommand({ Bucket: s3.bucket, Key: thumbKey(organisationId, p.id), Body: thumb, ContentType: 'image/jpeg' })),
    ]);
    rows.push({
      id: p.id,
      organisation_id: organisationId,
      observation_id: p.observationId,
      uploaded_by: p.draft.by,
      status: 'stored',
      object_key: photoKey(organisationId, p.id),
      thumb_key: thumbKey(organisationId, p.id),
      content_type: 'image/jpeg',
      bytes: original.length,
      width: 960,
      height: 720,
      sha256: createHash('sha256').update(original).digest('hex'),
      taken_at: p.observedAt,
      stored_at: knex.fn.now(),
    });
  };
  for (let i = 0; i < todo.length; i += 4) await Promise.all(todo.slice(i, i + 4).map(work));
  if (rows.length) await knex('photos').insert(rows).onConflict('id').ignore();
  s3.client.destroy();
}

export async function seedDemoObservations(knex: Knex, organisationId: string, options: DemoObservationOptions = {}) {
  [SCOUT, PRUNER, MANAGER] = [demoUser('scout'), demoUser('pruner'), demoUser('manager')];
  const blockIds = DEMO_BLOCKS.map((b) => b.id);
  const slots: (Slot & { block_id: string })[] = await knex('vine_positions')
    .whereIn('block_id', blockIds)
    .select('id', 'block_id', { row: 'row_number' }, 'position', 'status');
  const slotsByBlock = new Map<string, Slot[]>();
  const slotAt = new Map<string, Slot>();
  for (const s of slots) {
    (slotsByBlock.get(s.block_id) ?? slotsByBlock.set(s.block_id, []).get(s.block_id)!).push(s);
    slotAt.set(`${s.block_id}:${s.row}:${s.position}`, s);
  }

  const drafts: Draft[] = [];
  creekFlat(drafts);
  holes(drafts, slotsByBlock);
  otherBlocks(drafts);

  const rand = random(99);
  const rows: Record<string, unknown>[] = [];
  const photos: Photo[] = [];
  for (const d of drafts) {
    const slot = slotAt.get(`${d.block.id}:${d.row}:${d.position}`);
    if (!slot) continue;
    const id = demoId(`observation:${d.key}`);
    const observedAt = at(d.day, rand);
    const note = d.note ?? '';
    const record = { id, blockId: d.block.id, row: d.row, position: d.position, kind: d.kind, data: d.data, note, observedAt };
    rows.push({
      id,
      organisation_id: organisationId,
      block_id: d.block.id,
      position_id: slot.id,
      row_number: d.row,
      position: d.position,
      kind: d.kind,
      data: JSON.stringify(d.data),
      note,
      observed_at: observedAt,
      recorded_by: d.by,
      severity: observationSeverity(d.kind, d.data as never),
      status: d.closedOn ? 'closed' : 'open',
      closed_at: d.closedOn ? `${d.closedOn}T16:00:00Z` : null,
      payload_sha256: createHash('sha256').update(JSON.stringify(record)).digest('hex'),
      received_at: observedAt,
      updated_at: observedAt,
    });
    if (d.photo) photos.push({ id: demoId(`photo:${d.key}`), observationId: id, draft: d, observedAt });
  }
  for (let i = 0; i < rows.length; i += 1000) {
    await knex('observations')
      .insert(rows.slice(i, i + 1000))
      .onConflict('id')
      .ignore();
  }
  await seedPhotos(knex, organisationId, photos, options.env ?? process.env);
}
