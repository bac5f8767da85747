import 'server-only';
import type { GridResponse, PhotoLogResponse, VinePanelResponse, VineRow } from '@/lib/contracts/grid';
import type { Sendable } from '@/lib/contracts/http';
import type { GridFilters } from '@/lib/grid/filters';
import { packRow } from '@/lib/grid/cells';
import { describeData } from '@/lib/grid/labels';
import { encodeCursor, type PhotoCursor, type PhotoFilters } from '@/lib/grid/photo-filters';
import { summariseGrid } from '@/lib/grid/summary';
import { planFromObservations } from '@/lib/grid/vine-plan';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getBlock } from '@/lib/server/queries/blocks';
import {
  findVineByAddress,
  getVine,
  listObservationPhotos,
  listPlantings,
  listVineComments,
  listVineFlags,
  listVineObservations,
  loadGrid,
} from '@/lib/server/queries/grid';
import { getStoredPhoto, listPhotoLog } from '@/lib/server/queries/photo-log';
import { presignGet } from '@/lib/server/storage';
import { settingsForBlock } from '@/lib/server/services/settings';

/** The block's row grid and its summary, with the time its SQL took (for Server-Timing). */
export async function gridView(member: Member, blockId: string, filters: GridFilters): Promise<{ grid: GridResponse; sqlMs: number }> {
  // The block and its grid at once, one round trip sooner: the grid is only read, and none of it
  // leaves here unless the block is found in the member's organisation.
  let sqlMs = 0;
  const [block, ascending] = await Promise.all([
    getBlock(db(), member.organisationId, blockId),
    (async () => {
      const started = performance.now();
      const grid = await loadGrid(db(), member.organisationId, blockId, filters);
      sqlMs = performance.now() - started;
      return grid;
    })(),
  ]);
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
  const grid = block.row_order === 'descending' ? { ...ascending, rows: [...ascending.rows].reverse(), cells: [...ascending.cells].reverse() } : ascending;
  return {
    grid: {
      block: {
        id: block.id,
        name: block.name,
        variety: block.variety,
        trainingSystem: block.training_system,
        rowCount: block.row_count,
        vinesPerRow: block.vines_per_row,
        vinesPerPanel: block.vines_per_panel,
        rowOrder: block.row_order,
        positionOrigin: block.position_origin,
      },
      filters,
      rows: grid.rows,
      cells: grid.cells.map(packRow),
      summary: summariseGrid(grid.rows, grid.cells, grid.kinds, grid.vinesScouted),
    },
    sqlMs,
  };
}

/** Everything the vine panel shows, for a slot already checked to belong to the member's organisation. */
async function vinePanel(member: Member, vine: VineRow): Promise<Sendable<VinePanelResponse>> {
  const org = member.organisationId;
  const [plantings, observations, flags, comments, { settings }] = await Promise.all([
    listPlantings(db(), vine.positionId),
    listVineObservations(db(), org, vine.positionId),
    listVineFlags(db(), org, vine.positionId),
    listVineComments(db(), org, vine.positionId),
    settingsForBlock(db(), org, vine.blockId),
  ]);
  const photos = await listObservationPhotos(
    db(),
    org,
    observations.map((o) => o.id),
  );
  const readings = observations.map((o) => ({ kind: o.kind, data: o.data, observedAt: o.observedAt.toISOString() }));
  const address = `row=${vine.row}&position=${vine.position}`;
  return {
    vine,
    plantings,
    observations: observations.map((o) => ({
      ...o,
      summary: describeData(o.kind, o.data, member.unitSystem),
      photos: photos.filter((p) => p.observationId === o.id).map(({ observationId: _, ...p }) => p),
    })),
    plan: planFromObservations(vine.trainingSystem, readings, vine.vineSpacingM, settings),
    flags,
    comments,
    units: member.unitSystem,
    walkUrl: `/field/blocks/${vine.blockId}/walk?${address}`,
    gridUrl: `/grid/${vine.blockId}?${address}`,
  };
}

/** The vine panel for a slot by its id. */
export async function vinePanelById(member: Member, positionId: string) {
  const vine = await getVine(db(), member.organisationId, positionId);
  if (!vine) throw new AppError('not-found', 'There is no such vine in your organisation.');
  return vinePanel(member, vine);
}

/** The vine panel for a slot by the address the grid knows. */
export async function vinePanelAt(member: Member, address: { block: string; row: number; position: number }) {
  const vine = await findVineByAddress(db(), member.organisationId, address.block, address.row, address.position);
  if (!vine) throw new AppError('not-found', 'There is no vine at that address in your organisation.');
  return vinePanel(member, vine);
}

/** One page of the photo log, newest first, each photo with its finding and where it was taken. */
export async function photoLog(member: Member, filters: PhotoFilters, cursor: PhotoCursor | null, limit: number): Promise<Sendable<PhotoLogResponse>> {
  const rows = await listPhotoLog(db(), member.organisationId, filters, cursor, limit);
  const shown = rows.slice(0, limit);
  const last = shown[shown.length - 1];
  return {
    photos: shown.map((p) => ({
      id: p.id,
      thumbUrl: `/api/photos/${p.id}?size=thumb`,
      fullUrl: `/api/photos/${p.id}?size=full`,
      width: p.width,
      height: p.height,
      takenAt: p.takenAt,
      observation: {
        id: p.observationId,
        kind: p.kind,
        severity: p.severity,
        status: p.status,
        note: p.note,
        observedAt: p.observedAt,
        summary: describeData(p.kind, p.data, member.unitSystem),
      },
      block: { id: p.blockId, name: p.blockName },
      row: p.row,
      position: p.position,
      positionId: p.positionId,
      recordedByName: p.recordedByName,
      gridUrl: `/grid/${p.blockId}?row=${p.row}&position=${p.position}`,
    })),
    nextCursor: rows.length > limit && last ? encodeCursor({ at: last.takenAt, id: last.id }) : null,
  };
}

// Long enough for a slow phone to start the download, short enough that a leaked link soon dies.
const LINK_SECONDS = 120;

/** A short-lived link to a stored photo (its thumbnail when asked for and made) for a member of its organisation. */
export async function photoLink(member: Member, photoId: string, size: 'thumb' | 'full') {
  const photo = await getStoredPhoto(db(), member.organisationId, photoId);
  if (!photo) throw new AppError('not-found', 'There is no such photo in your organisation.');
  return presignGet(size === 'thumb' && photo.thumbKey ? photo.thumbKey : photo.objectKey, LINK_SECONDS);
}
