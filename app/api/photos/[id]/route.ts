import { NextResponse } from 'next/server';
import { z } from 'zod';
import { answersRaw } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { photoLink } from '@/lib/server/services/grid';
import { idParams } from '@/lib/validation/params';

const sizeSchema = z.object({ size: z.enum(['thumb', 'full'], 'Must be thumb or full').default('full') });

/** GET /api/photos/:id?size=thumb|full — after the guard, a redirect to a short-lived link to the private object. */
export const GET = memberRoute({ params: idParams('a photo'), query: sizeSchema, response: answersRaw }, async (member, { params, query }) => {
  const res = NextResponse.redirect(await photoLink(member, params.id, query.size), 302);
  // The browser may reuse the redirect for a minute, well inside the link's life.
  res.headers.set('Cache-Control', 'private, max-age=60');
  return res;
});
