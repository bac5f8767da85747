import { NextResponse } from 'next/server';
import { db } from '@/lib/server/db';
import { storageReachable } from '@/lib/server/storage';

export const dynamic = 'force-dynamic';

async function databaseReachable() {
  try {
    await db().raw('select 1');
    return true;
  } catch {
    return false;
  }
}

export async function GET() {
  const [database, storage] = await Promise.all([databaseReachable(), storageReachable()]);
  const ok = database && storage;
  return NextResponse.json({ ok, database, storage }, { status: ok ? 200 : 503, headers: { 'cache-control': 'no-store' } });
}
