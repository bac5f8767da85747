/**
 * Client-side sign-in against next-auth's endpoints. We post the form ourselves (rather than
 * next-auth/react's signIn) so that a 429 from the rate limiter reaches the person as its message.
 */
import { forgetSignedInPerson } from '@/lib/shared-phone';

export type SignInResult = { ok: true } | { ok: false; message: string };

async function csrfToken() {
  const res = await fetch('/api/auth/csrf');
  return ((await res.json()) as { csrfToken: string }).csrfToken;
}

async function post(path: string, fields: Record<string, string>): Promise<SignInResult & { url?: string }> {
  const body = new URLSearchParams({ ...fields, csrfToken: await csrfToken(), json: 'true' });
  const res = await fetch(path, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-auth-return-redirect': '1' },
    body,
  });
  const data = (await res.json().catch(() => ({}))) as { url?: string; error?: { message?: string } };
  if (res.status === 429 || data.error) return { ok: false, message: data.error?.message ?? 'Too many attempts; wait and try again.' };
  // A refused password comes back as 401 with the error in the URL, like other failures.
  if (!res.ok && !(res.status === 401 && data.url)) {
    return { ok: false, message: 'Sign-in is not available right now. Try again in a minute.' };
  }
  const error = data.url ? new URL(data.url, location.origin).searchParams.get('error') : null;
  if (error) return { ok: false, message: describeAuthError(error) };
  return { ok: true, url: data.url };
}

export function describeAuthError(code: string) {
  switch (code) {
    case 'CredentialsSignin':
      return 'That e-mail and password do not match. Check both, or ask for a sign-in link instead.';
    case 'Verification':
      return 'That sign-in link has expired or was already used. Ask for a new one.';
    case 'EmailSignin':
      return 'The sign-in link cannot be sent right now: the mail server is not answering. Try again in a few minutes, or sign in with your password.';
    case 'AccessDenied':
      return 'This address has no access to Vineward. Ask your vineyard manager for an invitation.';
    default:
      return 'Sign-in failed. Try again, or ask for a sign-in link.';
  }
}

export function signInWithPassword(email: string, password: string, callbackUrl = '/') {
  return post('/api/auth/callback/credentials', { email, password, callbackUrl });
}

export function requestSignInLink(email: string, callbackUrl = '/') {
  return post('/api/auth/signin/email', { email, callbackUrl });
}

/**
 * Ends the session (next-auth clears its cookie), then forgets this person's cached pages, API
 * answers and local copies on the phone, keeping the outbox (lib/shared-phone.ts), and goes back
 * to the sign-in page. Throws when the server cannot be reached: nothing is forgotten then.
 */
export async function signOut() {
  const res = await fetch('/api/auth/signout', {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ csrfToken: await csrfToken(), json: 'true' }),
  });
  if (!res.ok) throw new Error(`Sign-out answered ${res.status}`);
  await forgetSignedInPerson();
  window.location.assign('/signin');
}
