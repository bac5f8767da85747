import { NextResponse } from 'next/server';
import { parseGridFilters } from '@/lib/grid/filters';
import { summariseGrid } from '@/lib/grid/summary';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getBlock } from '@/lib/server/queries/blocks';
import { loadGrid } from '@/lib/server/queries/grid';
import { blockIdParams } from '@/lib/validation/params';

/** GET /api/grid/:blockId?kind=a,b&from=&to=&by=&status=open|closed|all&flagged=1 — the block's row grid and its summary. */
export const GET = memberRoute({ params: blockIdParams }, async (member, { params, req }) => {
  const block = await getBlock(db(), member.organisationId, params.blockId);
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
  const filters = parseGridFilters(req.nextUrl.searchParams);
  const started = performance.now();
  const grid = await loadGrid(db(), member.organisationId, block.id, block.row_order, filters);
  const sqlMs = performance.now() - started;
  return NextResponse.json(
    {
      block: {
        id: block.id,
        name: block.name,
        variety: block.variety,
        trainingSystem: block.training_system,
        rowCount: block.row_count,
        vinesPerRow: block.vines_per_row,
        vinesPerPanel: block.vines_per_panel,
        rowOrder: block.row_order,
        positionOrigin: block.position_origin,
      },
      filters,
      rows: grid.rows,
      cells: grid.cells,
      summary: summariseGrid(grid.rows, grid.cells, grid.kinds, grid.vinesScouted),
    },
    { headers: { 'Cache-Control': 'private, no-store', 'Server-Timing': `sql;dur=${sqlMs.toFixed(1)}` } },
  );
});
