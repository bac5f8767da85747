import NextAuth from 'next-auth';
import type { NextRequest } from 'next/server';
import { authOptions } from '@/lib/server/auth/options';
import { assertSignInAllowed, requestAddress } from '@/lib/server/auth/rate-limit';
import { errorResponse } from '@/lib/server/http';

type Segment = { params: Promise<{ nextauth: string[] }> };

const handle = (req: NextRequest, segment: Segment) => NextAuth(authOptions())(req, segment);

export const GET = handle;

export async function POST(req: NextRequest, segment: Segment) {
  const { nextauth } = await segment.params;
  // Sign-in attempts over the limit get a 429 before next-auth sees them.
  if (nextauth.join('/') === 'callback/credentials' || nextauth.join('/') === 'signin/email') {
    const form = await req.clone().formData().catch(() => undefined);
    const email = String(form?.get('email') ?? '').trim().toLowerCase();
    try {
      await assertSignInAllowed(requestAddress(req.headers), email);
    } catch (err) {
      return errorResponse(err);
    }
  }
  return handle(req, segment);
}
