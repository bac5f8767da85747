import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import EmailProvider from 'next-auth/providers/email';
import { getEnv } from '@/lib/env';
import { knexAdapter } from '@/lib/server/auth/adapter';
import { verifyPassword } from '@/lib/server/auth/passwords';
import { clearFailedSignIns, requestAddress, recordFailedSignIn } from '@/lib/server/auth/rate-limit';
import { db } from '@/lib/server/db';
import { linkMail, sendMail } from '@/lib/server/mail';
import { getUserByEmail } from '@/lib/server/queries/users';
import { signInSchema } from '@/lib/validation/auth';

export const SIGN_IN_LINK_MINUTES = 30;

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
          const parsed = signInSchema.safeParse(credentials);
          if (!parsed.success) return null;
          const { email, password } = parsed.data;
          const user = await getUserByEmail(db(), email);
          const ok = !!user?.password_hash && (await verifyPassword(password, user.password_hash));
          if (!ok || !user) {
            await recordFailedSignIn(requestAddress(req?.headers), email);
            return null;
          }
          await clearFailedSignIns(email);
          return { id: user.id, email: user.email, name: user.name };
        },
      }),
      EmailProvider({
        server: env.SMTP_URL,
        from: env.MAIL_FROM,
        maxAge: SIGN_IN_LINK_MINUTES * 60,
        async sendVerificationRequest({ identifier, url }) {
          await sendMail(
            linkMail({
              to: identifier,
              subject: 'Your Vineward sign-in link',
              intro: 'Someone (hopefully you) asked to sign in to Vineward with this e-mail address.',
              action: 'Sign in to Vineward',
              url,
              outro: `The link works once and expires in ${SIGN_IN_LINK_MINUTES} minutes. If you did not ask for it, ignore this mail.`,
            }),
          );
        },
      }),
    ],
    callbacks: {
      async signIn({ user, email }) {
        // Links go only to people who already belong to Vineward; strangers see the same
        // "check your e-mail" page so that addresses cannot be probed.
        if (email?.verificationRequest) {
          const known = user.email ? await getUserByEmail(db(), user.email) : undefined;
          return known ? true : '/signin/check-email';
        }
        return true;
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
