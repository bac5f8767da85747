import { describeData } from '@/lib/grid/labels';
import { decodeCursor, encodeCursor, parsePhotoFilters, parsePhotoPage } from '@/lib/grid/photo-filters';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { listPhotoLog } from '@/lib/server/queries/photo-log';

/** GET /api/photos?block=&row=&kind=&severity=&by=&from=&to=&cursor=&limit= — the photo log, newest first. */
export const GET = memberRoute({}, async (member, { req }) => {
  const search = req.nextUrl.searchParams;
  const filters = parsePhotoFilters(search);
  const page = parsePhotoPage(search);
  const cursor = page.cursor ? decodeCursor(page.cursor) : null;
  if (page.cursor && !cursor) throw new AppError('invalid-input', 'Some fields are not valid.', { cursor: ['Not a cursor this list gave out'] });
  const rows = await listPhotoLog(db(), member.organisationId, filters, cursor, page.limit);
  const shown = rows.slice(0, page.limit);
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
    nextCursor: rows.length > page.limit && last ? encodeCursor({ at: last.takenAt, id: last.id }) : null,
  };
});
