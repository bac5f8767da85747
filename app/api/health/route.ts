import { NextResponse } from 'next/server';
import type { Health } from '@/lib/contracts/health';
import { checkHealth } from '@/lib/server/services/health';

export const dynamic = 'force-dynamic';

/**
 * Only a missing database makes the server unfit to serve (503): without object storage or mail
 * the other routes keep working, so a load balancer must not take every server out for them;
 * `ok` and the flags say what is down.
 */
export async function GET(): Promise<NextResponse<Health>> {
  const health = await checkHealth();
  return NextResponse.json(health, { status: health.database ? 200 : 503, headers: { 'cache-control': 'no-store' } });
}
