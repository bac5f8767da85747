import 'server-only';
import type { Adapter, AdapterAccount, AdapterUser, VerificationToken } from 'next-auth/adapters';
import { db } from '@/lib/server/db';
import { getUserByEmail, getUserById, insertUser, updateUser, type UserRow } from '@/lib/server/queries/users';

/**
 * next-auth has no Knex adapter, so this is ours: just what the e-mail sign-in link needs
 * (users and one-time verification tokens). Sessions themselves are signed tokens.
 */
const toAdapterUser = (row: UserRow): AdapterUser => ({
  id: row.id,
  email: row.email,
  name: row.name,
  emailVerified: row.email_verified,
});

export const knexAdapter: Adapter = {
  async createUser(user: Omit<AdapterUser, 'id'>) {
    return toAdapterUser(await insertUser(db(), { email: user.email, name: user.name, emailVerified: user.emailVerified }));
  },
  async getUser(id: string) {
    const row = await getUserById(db(), id);
    return row ? toAdapterUser(row) : null;
  },
  async getUserByEmail(email: string) {
    const row = await getUserByEmail(db(), email);
    return row ? toAdapterUser(row) : null;
  },
  async getUserByAccount({ provider, providerAccountId }: Pick<AdapterAccount, 'provider' | 'providerAccountId'>) {
    const row = await db()('accounts as a')
      .join('users as u', 'u.id', 'a.user_id')
      .where({ 'a.provider': provider, 'a.provider_account_id': providerAccountId })
      .first<UserRow | undefined>('u.*');
    return row ? toAdapterUser(row) : null;
  },
  async updateUser(user: Partial<AdapterUser> & Pick<AdapterUser, 'id'>) {
    const patch: Parameters<typeof updateUser>[2] = {};
    if (user.name !== undefined) patch.name = user.name;
    if (user.emailVerified !== undefined) patch.email_verified = user.emailVerified;
    const row = Object.keys(patch).length ? await updateUser(db(), user.id, patch) : await getUserById(db(), user.id);
    if (!row) throw new Error(`No user ${user.id}`);
    return toAdapterUser(row);
  },
  async linkAccount(account: AdapterAccount) {
    await db()('accounts').insert({
      user_id: account.userId,
      type: account.type,
      provider: account.provider,
      provider_account_id: account.providerAccountId,
    });
    return account;
  },
  async createVerificationToken(token: VerificationToken) {
    await db()('verification_tokens').insert({ identifier: token.identifier, token: token.token, expires: token.expires });
    return token;
  },
  async useVerificationToken({ identifier, token }: { identifier: string; token: string }) {
    const [row] = await db()('verification_tokens').where({ identifier, token }).delete().returning('*');
    return row ? { identifier: row.identifier, token: row.token, expires: row.expires } : null;
  },
};
