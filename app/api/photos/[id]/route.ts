import { NextResponse } from 'next/server';
import { z } from 'zod';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getStoredPhoto } from '@/lib/server/queries/photo-log';
import { presignGet } from '@/lib/server/storage';
import { idParams } from '@/lib/validation/params';

const sizeSchema = z.strictObject({ size: z.enum(['thumb', 'full'], 'Must be thumb or full').default('full') });

// Long enough for a slow phone to start the download, short enough that a leaked link soon dies.
const LINK_SECONDS = 120;

/** GET /api/photos/:id?size=thumb|full — after the guard, a redirect to a short-lived link to the private object. */
export const GET = memberRoute({ params: idParams('a photo') }, async (member, { params, req }) => {
  const photo = await getStoredPhoto(db(), member.organisationId, params.id);
  if (!photo) throw new AppError('not-found', 'There is no such photo in your organisation.');
  const { size } = sizeSchema.parse({ size: req.nextUrl.searchParams.get('size') ?? undefined });
  const key = size === 'thumb' && photo.thumbKey ? photo.thumbKey : photo.objectKey;
  const res = NextResponse.redirect(await presignGet(key, LINK_SECONDS), 302);
  // The browser may reuse the redirect for a minute, well inside the link's life.
  res.headers.set('Cache-Control', 'private, max-age=60');
  return res;
});
