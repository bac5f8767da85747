import { NextResponse } from 'next/server';
import { db } from '@/lib/server/db';
import { mailReachable } from '@/lib/server/mail';
import { pingDatabase } from '@/lib/server/queries/health';
import { storageReachable } from '@/lib/server/storage';

export const dynamic = 'force-dynamic';

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

/**
 * Each dependency, checked within a few seconds. Only a missing database makes the server unfit
 * to serve (503): without object storage or mail the other routes keep working, so a load
 * balancer must not take every server out for them; `ok` and the flags say what is down.
 */
export async function GET() {
  const [database, storage, mail] = await Promise.all([databaseReachable(), storageReachable(), mailReachable(CHECK_MS)]);
  const ok = database && storage && mail;
  return NextResponse.json({ ok, database, storage, mail }, { status: database ? 200 : 503, headers: { 'cache-control': 'no-store' } });
}
