import 'server-only';
import type { Health } from '@/lib/contracts/health';
import { db } from '@/lib/server/db';
import { mailReachable } from '@/lib/server/mail';
import { pingDatabase } from '@/lib/server/queries/health';
import { storageReachable } from '@/lib/server/storage';

const CHECK_MS = 3000;

function within<T>(ms: number, check: Promise<T>, otherwise: T) {
  return Promise.race([check, new Promise<T>((resolve) => setTimeout(() => resolve(otherwise), ms).unref())]);
}

async function databaseReachable() {
  try {
    return await within(CHECK_MS, pingDatabase(db()), false);
  } catch {
    return false;
  }
}

/** Each dependency, checked within a few seconds. */
export async function checkHealth(): Promise<Health> {
  const [database, storage, mail] = await Promise.all([databaseReachable(), storageReachable(), mailReachable(CHECK_MS)]);
  return { ok: database && storage && mail, database, storage, mail };
}
