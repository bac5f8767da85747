/**
 * Compiled by `npm test`'s type-check, never run: each `@ts-expect-error` below must stay an error,
 * so a route that names no contract, or answers another shape than its contract, fails to compile.
 */
import { NextResponse } from 'next/server';
import type { BlockOne } from '@/lib/contracts/blocks';
import { answersRaw, responds } from '@/lib/contracts/http';
import { memberRoute, publicRoute } from '@/lib/server/http';

export const routes = () => [
  // @ts-expect-error a route must name what it answers
  memberRoute({}, async () => ({ anything: true })),
  // @ts-expect-error a public route too
  publicRoute({}, async () => ({ anything: true })),
  // @ts-expect-error an answer missing a field of its contract
  memberRoute({ response: responds<BlockOne>() }, async () => ({})),
  // @ts-expect-error a JSON answer wrapped in NextResponse is checked all the same
  memberRoute({ response: responds<{ ok: true }>() }, async () => NextResponse.json({ ok: false })),
  // @ts-expect-error a JSON route cannot hand back a bare Response (CSV, redirect) unless it says so
  memberRoute({ response: responds<{ ok: true }>() }, async () => new Response('a,b')),
  memberRoute({ response: answersRaw }, async () => new Response('a,b', { headers: { 'content-type': 'text/csv' } })),
  memberRoute({ response: responds<{ at: string }>() }, async () => ({ at: new Date() })),
];
