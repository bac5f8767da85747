import 'server-only';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import {
  blockHasFieldRecords,
  changeSlotStatus,
  countSlotsByBlock,
  countSlotsByRow,
  emptyCounts,
  getBlock,
  getBlockForUpdate,
  getPosition,
  insertBlock,
  listBlockRows,
  listBlocks,
  listLayoutLetters,
  listPositions,
  listRemovedSlotsWithRecords,
  listSlotVines,
  shiftRowNumbers,
  summariseLayoutChange,
  updateBlock as updateBlockColumns,
  writeLayout,
  type BlockColumns,
  type BlockRow,
  type LayoutRowSpec,
  type StatusCounts,
} from '@/lib/server/queries/blocks';
import type { BlockView, LayoutSummary } from '@/lib/contracts/blocks';
import type { Db } from '@/lib/server/db';
import { vinesPerAreaFor } from '@/lib/units';
import { formatLayoutCsv, parseLayoutCsv, SLOT_STATUSES, type BlockInput, type SlotStatusInput } from '@/lib/validation/block';

export type { BlockView, LayoutSummary };

export function toBlockView(row: BlockRow, counts: StatusCounts = emptyCounts()): BlockView {
  const rowSpacingM = Number(row.row_spacing_m);
  const vineSpacingM = Number(row.vine_spacing_m);
  const vineCount = SLOT_STATUSES.reduce((sum, s) => sum + counts[s], 0);
  return {
    id: row.id,
    name: row.name,
    variety: row.variety,
    clone: row.clone,
    rootstock: row.rootstock,
    plantingYear: row.planting_year,
    trainingSystem: row.training_system,
    rowSpacingM,
    vineSpacingM,
    rowCount: row.row_count,
    vinesPerRow: row.vines_per_row,
    vinesPerPanel: row.vines_per_panel,
    firstRow: row.first_row,
    rowOrder: row.row_order,
    positionOrigin: row.position_origin,
    rowBearingDeg: row.row_bearing_deg,
    notes: row.notes,
    archivedAt: row.archived_at ? row.archived_at.toISOString() : null,
    updatedAt: row.updated_at.toISOString(),
    vineCount,
    counts,
    areaM2: vineCount * rowSpacingM * vineSpacingM,
    vinesPerHa: vinesPerAreaFor(rowSpacingM, vineSpacingM, 'metric'),
    vinesPerAcre: vinesPerAreaFor(rowSpacingM, vineSpacingM, 'imperial'),
  };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const notFound = () => new AppError('not-found', 'There is no such block in your organisation.');

/** Ids come from URLs: anything that is not one of this organisation's blocks answers 404. */
async function findBlock(conn: Db, member: Member, blockId: string, lock = false) {
  if (!UUID.test(blockId)) throw notFound();
  const block = lock ? await getBlockForUpdate(conn, member.organisationId, blockId) : await getBlock(conn, member.organisationId, blockId);
  if (!block) throw notFound();
  return block;
}

function refuseArchived(block: BlockRow) {
  if (block.archived_at) throw new AppError('conflict', `${block.name} is archived. Restore it before changing it.`);
}

const thisYear = () => new Date().getFullYear();

const plantOf = (b: BlockRow) => ({ plantingYear: b.planting_year, clone: b.clone, rootstock: b.rootstock });

/** Block names are unique among an organisation's active blocks (a partial unique index). */
async function uniqueName<T>(name: string, work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (err) {
    if ((err as { code?: string; constraint?: string }).constraint === 'blocks_name_unique') {
      throw new AppError('conflict', `There is already a block called ${name}.`, { name: ['Another block has this name'] });
    }
    throw err;
  }
}

function columnsOf(input: BlockInput): BlockColumns {
  return {
    name: input.name,
    variety: input.variety,
    clone: input.clone,
    rootstock: input.rootstock,
    planting_year: input.plantingYear,
    training_system: input.trainingSystem,
    row_spacing_m: input.rowSpacingM,
    vine_spacing_m: input.vineSpacingM,
    row_count: input.rowCount,
    vines_per_row: input.vinesPerRow,
    vines_per_panel: input.vinesPerPanel,
    first_row: input.firstRow,
    row_order: input.rowOrder,
    position_origin: input.positionOrigin,
    row_bearing_deg: input.rowBearingDeg,
    notes: input.notes,
  };
}

function inputOf(b: BlockRow): BlockInput {
  const v = toBlockView(b);
  return {
    name: v.name,
    variety: v.variety,
    clone: v.clone,
    rootstock: v.rootstock,
    plantingYear: v.plantingYear,
    trainingSystem: v.trainingSystem,
    rowSpacingM: v.rowSpacingM,
    vineSpacingM: v.vineSpacingM,
    rowCount: v.rowCount,
    vinesPerRow: v.vinesPerRow,
    vinesPerPanel: v.vinesPerPanel,
    firstRow: v.firstRow,
    rowOrder: v.rowOrder,
    positionOrigin: v.positionOrigin,
    rowBearingDeg: v.rowBearingDeg,
    notes: v.notes,
  };
}

async function viewOf(conn: Db, block: BlockRow) {
  const byRow = await countSlotsByRow(conn, block.id);
  const counts = emptyCounts();
  for (const c of byRow.values()) for (const s of SLOT_STATUSES) counts[s] += c[s];
  return toBlockView(block, counts);
}

/** A row or vine number from a URL; anything else names no slot of the block. */
export function numberParam(value: string | string[] | undefined, what: string) {
  const n = typeof value === 'string' && /^\d{1,6}$/.test(value) ? Number(value) : NaN;
  if (!Number.isSafeInteger(n) || n < 1) throw new AppError('not-found', `There is no ${what} ${String(value)} in this block.`);
  return n;
}

export async function listBlockViews(member: Member, o: { archived?: boolean } = {}) {
  const [blocks, counts] = await Promise.all([listBlocks(db(), member.organisationId, o), countSlotsByBlock(db(), member.organisationId)]);
  return blocks.map((b) => toBlockView(b, counts.get(b.id)));
}

export async function getBlockDetail(member: Member, blockId: string) {
  const block = await findBlock(db(), member, blockId);
  const [rows, byRow] = await Promise.all([listBlockRows(db(), block.id), countSlotsByRow(db(), block.id)]);
  const counts = emptyCounts();
  for (const c of byRow.values()) for (const s of SLOT_STATUSES) counts[s] += c[s];
  return {
    block: toBlockView(block, counts),
    rows: rows.map((r) => ({ row: r.row_number, vineCount: r.vine_count, counts: byRow.get(r.row_number) ?? emptyCounts() })),
  };
}

const RECORD_WORDS: Record<string, string> = { task_items: 'tasks', task_updates: 'task updates' };

/**
 * Refuses a layout that would delete slots with observations or other field records on them:
 * the foreign keys cascade, so removing the slot would silently delete the work recorded there.
 */
async function refuseLosingFieldRecords(conn: Db, blockId: string, rows: LayoutRowSpec[]) {
  const { slots, total, kinds } = await listRemovedSlotsWithRecords(conn, blockId, rows);
  if (total === 0) return;
  const named = slots
    .slice(0, 5)
    .map((s) => `row ${s.row} vine ${s.position}`)
    .join(', ');
  const what = kinds.map((k) => RECORD_WORDS[k] ?? k.replace(/_/g, ' ')).join(', ');
  throw new AppError(
    'conflict',
    `This change would remove ${total} planting ${total === 1 ? 'slot that has' : 'slots that have'} ${what} (${named}${total > 5 ? ', …' : ''}). ` +
      'Keep those rows and vines, or move the records first. Nothing was changed.',
  );
}

const uniformRows = (firstRow: number, rowCount: number, vines: number): LayoutRowSpec[] =>
  Array.from({ length: rowCount }, (_, i) => ({ row: firstRow + i, vines, statuses: null }));

export async function createBlock(member: Member, input: BlockInput) {
  return uniqueName(input.name, () =>
    db().transaction(async (trx) => {
      const block = await insertBlock(trx, member.organisationId, columnsOf(input));
      await writeLayout(trx, block.id, uniformRows(input.firstRow, input.rowCount, input.vinesPerRow), plantOf(block), thisYear());
      return viewOf(trx, block);
    }),
  );
}

/**
 * Saves the block form. A new row count adds rows of the default length at the end or removes
 * rows from the end; a new vines-per-row default resizes the rows that had the old default and
 * leaves per-row overrides alone. A new first row renumbers the rows, which is refused once the
 * field has recorded anything against the old numbers.
 */
export async function updateBlock(member: Member, blockId: string, patch: Partial<BlockInput>) {
  const defined = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) as Partial<BlockInput>;
  return uniqueName(defined.name ?? 'that name', () =>
    db().transaction(async (trx) => {
      const block = await findBlock(trx, member, blockId, true);
      refuseArchived(block);
      const next = { ...inputOf(block), ...defined };
      if (next.firstRow !== block.first_row) {
        if (await blockHasFieldRecords(trx, block.id)) {
          throw new AppError('conflict', 'Rows cannot be renumbered once observations or sampling plans use their numbers.', {
            firstRow: ['Row numbers are already in use in the field'],
          });
        }
        await shiftRowNumbers(trx, block.id, next.firstRow - block.first_row);
      }
      if (next.rowCount !== block.row_count || next.vinesPerRow !== block.vines_per_row) {
        const current = new Map((await listBlockRows(trx, block.id)).map((r) => [r.row_number, r.vine_count]));
        const rows = uniformRows(next.firstRow, next.rowCount, next.vinesPerRow).map((r) => {
          const had = current.get(r.row);
          return { ...r, vines: had === undefined || had === block.vines_per_row ? next.vinesPerRow : had };
        });
        await refuseLosingFieldRecords(trx, block.id, rows);
        await writeLayout(trx, block.id, rows, { plantingYear: next.plantingYear, clone: next.clone, rootstock: next.rootstock }, thisYear());
      }
      return viewOf(trx, await updateBlockColumns(trx, block.id, columnsOf(next)));
    }),
  );
}

export async function setArchived(member: Member, blockId: string, archived: boolean) {
  return db().transaction(async (trx) => {
    const block = await findBlock(trx, member, blockId, true);
    if (Boolean(block.archived_at) === archived) return viewOf(trx, block);
    const updated = await uniqueName(block.name, () => updateBlockColumns(trx, block.id, { archived_at: archived ? new Date() : null }));
    return viewOf(trx, updated);
  });
}

/** A per-row override of the block's vines-per-row default. */
export async function setRowVineCount(member: Member, blockId: string, rowNumber: number, vineCount: number) {
  return db().transaction(async (trx) => {
    const block = await findBlock(trx, member, blockId, true);
    refuseArchived(block);
    const rows = (await listBlockRows(trx, block.id)).map((r) => ({ row: r.row_number, vines: r.vine_count, statuses: null }));
    const target = rows.find((r) => r.row === rowNumber);
    if (!target) throw new AppError('not-found', `${block.name} has no row ${rowNumber}.`);
    target.vines = vineCount;
    await refuseLosingFieldRecords(trx, block.id, rows);
    await writeLayout(trx, block.id, rows, plantOf(block), thisYear());
    await updateBlockColumns(trx, block.id, {});
    return { row: rowNumber, vineCount };
  });
}

export async function listSlots(member: Member, blockId: string, rowNumber?: number) {
  const block = await findBlock(db(), member, blockId);
  const slots = await listPositions(db(), block.id, rowNumber);
  if (rowNumber !== undefined && slots.length === 0) throw new AppError('not-found', `${block.name} has no row ${rowNumber}.`);
  return {
    blockId: block.id,
    vinesPerPanel: block.vines_per_panel,
    positions: slots.map((s) => ({ row: s.row_number, position: s.position, status: s.status, replantYear: s.replant_year })),
  };
}

export async function getSlot(member: Member, blockId: string, rowNumber: number, position: number, conn: Db = db()) {
  const block = await findBlock(conn, member, blockId);
  const slot = await getPosition(conn, block.id, rowNumber, position);
  if (!slot) throw new AppError('not-found', `${block.name} has no vine ${position} in row ${rowNumber}.`);
  const vines = await listSlotVines(conn, slot.id);
  return {
    slot: { row: slot.row_number, position: slot.position, status: slot.status, replantYear: slot.replant_year },
    vines: vines.map((v) => ({
      plantingYear: v.planting_year,
      clone: v.clone,
      rootstock: v.rootstock,
      removedYear: v.removed_year,
      removalReason: v.removal_reason,
    })),
  };
}

export async function setSlotStatus(member: Member, blockId: string, rowNumber: number, position: number, input: SlotStatusInput) {
  return db().transaction(async (trx) => {
    const block = await findBlock(trx, member, blockId, true);
    refuseArchived(block);
    const slot = await getPosition(trx, block.id, rowNumber, position);
    if (!slot) throw new AppError('not-found', `${block.name} has no vine ${position} in row ${rowNumber}.`);
    await changeSlotStatus(
      trx,
      slot.id,
      { status: input.status, year: input.year ?? thisYear(), clone: input.clone, rootstock: input.rootstock },
      plantOf(block),
    );
    await updateBlockColumns(trx, block.id, {});
    return getSlot(member, blockId, rowNumber, position, trx);
  });
}

/** The most common row length, which becomes the block's vines-per-row default after an import. */
function commonLength(rows: LayoutRowSpec[]) {
  const tally = new Map<number, number>();
  for (const r of rows) tally.set(r.vines, (tally.get(r.vines) ?? 0) + 1);
  return [...tally].sort((a, b) => b[1] - a[1] || b[0] - a[0])[0]![0];
}

/**
 * Checks a layout CSV and says what it would change (`apply` false), or applies it in one
 * transaction. A bad file is refused whole, line by line, and nothing changes.
 */
export async function importLayout(member: Member, blockId: string, csv: string, apply: boolean) {
  const work = async (conn: Db) => {
    const block = await findBlock(conn, member, blockId, apply);
    refuseArchived(block);
    const parsed = parseLayoutCsv(csv, block.first_row);
    if (!parsed.ok) {
      const fields: Record<string, string[]> = {};
      for (const p of parsed.problems) (fields[p.line === null ? 'file' : `line ${p.line}`] ??= []).push(p.message);
      const first = parsed.problems[0]!.message;
      if (parsed.tooLarge) throw new AppError('payload-too-large', first, fields);
      const more = parsed.total > 1 ? ` (and ${parsed.total - 1} more ${parsed.total === 2 ? 'problem' : 'problems'})` : '';
      throw new AppError('invalid-input', `${first.replace(/\.$/, '')}${more}. Nothing was changed.`, fields);
    }
    const rows: LayoutRowSpec[] = parsed.rows.map((r) => ({ row: r.row, vines: r.vines, statuses: r.statuses }));
    const before = await listBlockRows(conn, block.id);
    const beforeByRow = new Map(before.map((r) => [r.row_number, r.vine_count]));
    const afterRows = new Set(rows.map((r) => r.row));
    const change = await summariseLayoutChange(conn, block.id, rows);
    await refuseLosingFieldRecords(conn, block.id, rows);

    const after = emptyCounts();
    let added = 0;
    let statusChanged = 0;
    const statusChanges: LayoutSummary['statusChanges'] = [];
    for (const t of change.transitions) {
      after[t.to_status] += t.n;
      if (t.from_status === null) added += t.n;
      else if (t.from_status !== t.to_status) {
        statusChanged += t.n;
        statusChanges.push({ from: t.from_status, to: t.to_status, count: t.n });
      }
    }
    const summary: LayoutSummary = {
      applied: apply,
      rows: {
        before: before.length,
        after: rows.length,
        added: rows.filter((r) => !beforeByRow.has(r.row)).map((r) => r.row),
        removed: before.filter((r) => !afterRows.has(r.row_number)).map((r) => r.row_number),
        resized: rows
          .filter((r) => beforeByRow.has(r.row) && beforeByRow.get(r.row) !== r.vines)
          .map((r) => ({ row: r.row, from: beforeByRow.get(r.row)!, to: r.vines })),
      },
      slots: {
        before: before.reduce((sum, r) => sum + r.vine_count, 0),
        after: rows.reduce((sum, r) => sum + r.vines, 0),
        added,
        removed: change.slotsRemoved,
        statusChanged,
      },
      statusChanges: statusChanges.sort((a, b) => b.count - a.count),
      after,
    };
    if (apply) {
      await writeLayout(conn, block.id, rows, plantOf(block), thisYear());
      await updateBlockColumns(conn, block.id, { row_count: rows.length, vines_per_row: commonLength(rows) });
    }
    return summary;
  };
  return apply ? db().transaction(work) : work(db());
}

export async function exportLayout(member: Member, blockId: string) {
  const block = await findBlock(db(), member, blockId);
  return { name: block.name, csv: formatLayoutCsv(await listLayoutLetters(db(), block.id)) };
}
