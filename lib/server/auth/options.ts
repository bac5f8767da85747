import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import EmailProvider from 'next-auth/providers/email';
import { getEnv } from '@/lib/env';
import { knexAdapter } from '@/lib/server/auth/adapter';
import { normalizeLinkAddress } from '@/lib/server/auth/identifier';
import { dummyHash, verifyPassword } from '@/lib/server/auth/passwords';
import { accountKey, clearFailedSignIns, recordFailedSignIn, requestAddress, signInLocked } from '@/lib/server/auth/rate-limit';
import { sameOriginPath } from '@/lib/safe-redirect';
import { db } from '@/lib/server/db';
import { linkMail, mailReachable, sendMail } from '@/lib/server/mail';
import { getUserByEmail } from '@/lib/server/queries/users';
import { signInSchema } from '@/lib/validation/auth';

export const SIGN_IN_LINK_MINUTES = 30;
/** How long the mail server may take to greet us before a link request is refused. */
const LINK_PROBE_MS = 3_000;

export function authOptions(): NextAuthOptions {
  const env = getEnv();
  return {
    secret: env.NEXTAUTH_SECRET,
    adapter: knexAdapter,
    // Signed tokens keep the app servers stateless.
    session: { strategy: 'jwt', maxAge: 30 * 24 * 60 * 60 },
    pages: { signIn: '/signin', verifyRequest: '/signin/check-email', error: '/signin' },
    providers: [
      CredentialsProvider({
        id: 'credentials',
        name: 'E-mail and password',
        credentials: { email: { type: 'email' }, password: { type: 'password' } },
        async authorize(credentials, req) {
          const key = accountKey(credentials?.email);
          const address = requestAddress(req?.headers);
          // The route refuses locked accounts before next-auth runs; this holds even if its reading of the body ever differs.
          if (await signInLocked(address, key)) return null;
          const parsed = signInSchema.safeParse(credentials);
          const user = parsed.success ? await getUserByEmail(db(), parsed.data.email) : undefined;
          // Unknown addresses are checked against a dummy hash, so they take as long as known ones.
          const ok = await verifyPassword(parsed.success ? parsed.data.password : '', user?.password_hash || (await dummyHash()));
          if (!ok || !user?.password_hash) {
            await recordFailedSignIn(address, key);
            return null;
          }
          await clearFailedSignIns(key);
          return { id: user.id, email: user.email, name: user.name };
        },
      }),
      EmailProvider({
        server: env.SMTP_URL,
        from: env.MAIL_FROM,
        maxAge: SIGN_IN_LINK_MINUTES * 60,
        normalizeIdentifier: normalizeLinkAddress,
        async sendVerificationRequest({ identifier, url }) {
          // A mail server that does not greet us gets a refusal now (next-auth's EmailSignin), not a
          // "check your e-mail" for a mail that never comes. Asked before the address is looked up,
          // so the answer is the same for everyone.
          if (!(await mailReachable(LINK_PROBE_MS))) throw new Error('The mail server is not answering');
          // Links go only to people who already belong to Vineward. Every address gets the same
          // answer, and the mail goes out after it, so neither the answer nor its timing tells.
          if (!(await getUserByEmail(db(), identifier))) return;
          void sendMail(
            linkMail({
              to: identifier,
              subject: 'Your Vineward sign-in link',
              intro: 'Someone (hopefully you) asked to sign in to Vineward with this e-mail address.',
              action: 'Sign in to Vineward',
              url,
              outro: `The link works once and expires in ${SIGN_IN_LINK_MINUTES} minutes. If you did not ask for it, ignore this mail.`,
            }),
          ).catch((err: unknown) => console.error('A sign-in link could not be sent', err));
        },
      }),
    ],
    callbacks: {
      async signIn({ user, account, email }) {
        // Asking for a link answers alike for every address (sendVerificationRequest mails only
        // members); using one signs in only someone who already has an account.
        if (account?.provider === 'email' && !email?.verificationRequest) {
          return !!user.email && !!(await getUserByEmail(db(), user.email));
        }
        return true;
      },
      // Only paths of this site, whatever callbackUrl a link carried (lib/safe-redirect.ts).
      redirect({ url, baseUrl }) {
        return new URL(sameOriginPath(url, baseUrl), baseUrl).toString();
      },
      async jwt({ token, user }) {
        if (user) token.uid = user.id;
        return token;
      },
      async session({ session, token }) {
        if (session.user && typeof token.uid === 'string') session.user.id = token.uid;
        return session;
      },
    },
  };
}
