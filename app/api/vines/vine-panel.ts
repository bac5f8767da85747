import 'server-only';
import { describeData } from '@/lib/grid/labels';
import { planFromObservations } from '@/lib/grid/vine-plan';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { settingsForBlock } from '@/lib/server/services/settings';
import {
  listObservationPhotos,
  listPlantings,
  listVineComments,
  listVineFlags,
  listVineObservations,
  type VineRow,
} from '@/lib/server/queries/grid';

/** Everything the vine panel shows, for a slot already checked to belong to the member's organisation. */
export async function vinePanel(member: Member, vine: VineRow) {
  const org = member.organisationId;
  const [plantings, observations, flags, comments, { settings }] = await Promise.all([
    listPlantings(db(), vine.positionId),
    listVineObservations(db(), org, vine.positionId),
    listVineFlags(db(), org, vine.positionId),
    listVineComments(db(), org, vine.positionId),
    settingsForBlock(db(), org, vine.blockId),
  ]);
  const photos = await listObservationPhotos(db(), org, observations.map((o) => o.id));
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
