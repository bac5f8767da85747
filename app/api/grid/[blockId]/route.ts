import { NextResponse } from 'next/server';
import type { GridResponse } from '@/lib/contracts/grid';
import { responds } from '@/lib/contracts/http';
import { parseGridFilters } from '@/lib/grid/filters';
import { memberRoute } from '@/lib/server/http';
import { gridView } from '@/lib/server/services/grid';
import { blockIdParams } from '@/lib/validation/params';

/** GET /api/grid/:blockId?kind=a,b&from=&to=&by=&status=open|closed|all&flagged=1 — the block's row grid and its summary. */
export const GET = memberRoute({ params: blockIdParams, response: responds<GridResponse>() }, async (member, { params, req }) => {
  const { grid, sqlMs } = await gridView(member, params.blockId, parseGridFilters(req.nextUrl.searchParams));
  return NextResponse.json(grid, { headers: { 'Cache-Control': 'private, no-store', 'Server-Timing': `sql;dur=${sqlMs.toFixed(1)}` } });
});
