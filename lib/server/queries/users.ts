import 'server-only';
import type { Db } from '@/lib/server/db';

export interface UserRow {
  id: string;
  email: string;
  name: string | null;
  password_hash: string | null;
  email_verified: Date | null;
  locale: 'en' | 'es';
  created_at: Date;
}

export const normaliseEmail = (email: string) => email.trim().toLowerCase();

export function getUserById(db: Db, id: string) {
  return db<UserRow>('users').where({ id }).first();
}

export function getUserByEmail(db: Db, email: string) {
  return db<UserRow>('users')
    .where({ email: normaliseEmail(email) })
    .first();
}

export async function insertUser(
  db: Db,
  user: { email: string; name?: string | null; passwordHash?: string | null; emailVerified?: Date | null; locale?: 'en' | 'es' },
) {
  const [row] = await db<UserRow>('users')
    .insert({
      email: normaliseEmail(user.email),
      name: user.name ?? null,
      password_hash: user.passwordHash ?? null,
      email_verified: user.emailVerified ?? null,
      locale: user.locale ?? 'en',
    })
    .returning('*');
  return row!;
}

export async function updateUser(db: Db, id: string, patch: Partial<Pick<UserRow, 'name' | 'password_hash' | 'email_verified' | 'locale' | 'email'>>) {
  const [row] = await db<UserRow>('users').where({ id }).update(patch).returning('*');
  return row;
}

export async function userExists(db: Db, id: string) {
  return !!(await db('users').where({ id }).first('id'));
}
