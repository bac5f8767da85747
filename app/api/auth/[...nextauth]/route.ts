import NextAuth from 'next-auth';
import type { NextRequest } from 'next/server';
import { nextAuthBody } from '@/lib/server/auth/body';
import { linkIdentifier } from '@/lib/server/auth/identifier';
import { authOptions } from '@/lib/server/auth/options';
import { accountKey, assertSignInAllowed, consumeLinkRequest, requestAddress } from '@/lib/server/auth/rate-limit';
import { errorResponse } from '@/lib/server/http';

type Segment = { params: Promise<{ nextauth: string[] }> };

const handle = (req: NextRequest, segment: Segment) => NextAuth(authOptions())(req, segment);

export const GET = handle;

export async function POST(req: NextRequest, segment: Segment) {
  const action = (await segment.params).nextauth.join('/');
  // Attempts over a limit get a 429 before next-auth sees them, counted on the e-mail next-auth will read.
  if (action === 'callback/credentials' || action === 'signin/email') {
    try {
      const email = (await nextAuthBody(req))?.email;
      const address = requestAddress(req.headers);
      if (action === 'callback/credentials') await assertSignInAllowed(address, accountKey(email));
      else await consumeLinkRequest(address, linkIdentifier(email) ?? accountKey(email));
    } catch (err) {
      return errorResponse(err);
    }
  }
  const res = await handle(req, segment);
  // Sign-out on a shared phone: the browser drops its HTTP cache for the site (a photo's redirect is
  // kept a minute). Not "storage": that would take IndexedDB and the unsent outbox with it.
  if (action === 'signout') res.headers.set('Clear-Site-Data', '"cache"');
  return res;
}
