import type { PhotoLogResponse } from '@/lib/contracts/grid';
import { responds } from '@/lib/contracts/http';
import { decodeCursor, parsePhotoFilters, parsePhotoPage } from '@/lib/grid/photo-filters';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { photoLog } from '@/lib/server/services/grid';

/** GET /api/photos?block=&row=&kind=&severity=&by=&from=&to=&cursor=&limit= — the photo log, newest first. */
export const GET = memberRoute({ response: responds<PhotoLogResponse>() }, async (member, { req }) => {
  const search = req.nextUrl.searchParams;
  const filters = parsePhotoFilters(search);
  const page = parsePhotoPage(search);
  const cursor = page.cursor ? decodeCursor(page.cursor) : null;
  if (page.cursor && !cursor) throw new AppError('invalid-input', 'Some fields are not valid.', { cursor: ['Not a cursor this list gave out'] });
  return photoLog(member, filters, cursor, page.limit);
});
