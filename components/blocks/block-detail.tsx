'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Button, ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import type { BlockDetailView, BlockOne } from '@/lib/contracts/blocks';
import { formatAreaM2, formatCount, formatLengthM, formatVinesPerArea, type UnitSystem } from '@/lib/units';
import { apiGet, apiSend } from '@/lib/api-client';
import { RowSlots } from './row-slots';
import { StatusCounts as Counts } from './status';

const TRAINING = { cane: 'Cane-pruned', spur: 'Spur-pruned', other: 'Other training' } as const;

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="flex flex-col border-b border-line py-2 sm:flex-row sm:gap-4">
      <dt className="font-bold sm:w-48 sm:shrink-0">{label}</dt>
      <dd>{children}</dd>
    </div>
  );
}

/** A block's page: facts, counts of slots by status, its rows, and one row's slots at a time. */
export function BlockDetail({ blockId, units, canManage }: { blockId: string; units: UnitSystem; canManage: boolean }) {
  const queryClient = useQueryClient();
  const [openRow, setOpenRow] = useState<number | null>(null);
  const detail = useQuery({ queryKey: ['block', blockId], queryFn: () => apiGet<BlockDetailView>(`/api/blocks/${blockId}`) });
  const archive = useMutation({
    mutationFn: (archived: boolean) => apiSend<BlockOne>('POST', `/api/blocks/${blockId}/${archived ? 'archive' : 'restore'}`),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: ['block', blockId] });
      await queryClient.invalidateQueries({ queryKey: ['blocks'] });
    },
  });

  if (detail.isPending) return <p aria-busy="true">Loading the block…</p>;
  if (detail.isError) return <Notice tone="error">{detail.error.message}</Notice>;
  const { block: b, rows } = detail.data;
  const lastRow = b.firstRow + b.rowCount - 1;
  const ordered = b.rowOrder === 'descending' ? [...rows].reverse() : rows;

  return (
    <div className="flex flex-col gap-6">
      <section className="flex flex-col gap-2">
        <p className="text-bark-soft">
          {b.variety} · {TRAINING[b.trainingSystem]}
        </p>
        <h1 className="text-3xl font-extrabold">
          {b.name}
          {b.archivedAt && <span className="ml-3 align-middle text-base font-bold text-cut">Archived</span>}
        </h1>
        <div className="flex flex-wrap gap-2">
          {canManage && !b.archivedAt && (
            <>
              <ButtonLink href={`/blocks/${b.id}/edit`}>Edit block</ButtonLink>
              <ButtonLink href={`/blocks/${b.id}/import`} variant="secondary">
                Import layout CSV
              </ButtonLink>
            </>
          )}
          <a
            href={`/api/blocks/${b.id}/layout.csv`}
            download
            className="inline-flex min-h-touch items-center rounded-lg border-2 border-rootstock bg-panel px-5 font-bold text-rootstock no-underline hover:bg-rootstock-tint"
          >
            Export layout CSV
          </a>
          {canManage && (
            <Button variant={b.archivedAt ? 'secondary' : 'quiet'} disabled={archive.isPending} onClick={() => archive.mutate(!b.archivedAt)}>
              {b.archivedAt ? 'Restore block' : 'Archive block'}
            </Button>
          )}
        </div>
        {archive.isError && <Notice tone="error">{archive.error.message}</Notice>}
      </section>

      <section aria-labelledby="counts-heading" className="flex flex-col gap-2">
        <h2 id="counts-heading" className="text-xl font-bold">
          Vines by status
        </h2>
        <Counts counts={b.counts} total={b.vineCount} />
      </section>

      <section aria-labelledby="facts-heading">
        <h2 id="facts-heading" className="text-xl font-bold">
          Layout
        </h2>
        <dl className="mt-2">
          <Fact label="Clone and rootstock">
            {b.clone ?? 'clone not recorded'} on {b.rootstock ?? 'rootstock not recorded'}
          </Fact>
          <Fact label="Planted">{b.plantingYear ?? 'not recorded'}</Fact>
          <Fact label="Spacing">
            {formatLengthM(b.rowSpacingM, units)} between rows, {formatLengthM(b.vineSpacingM, units)} between vines
          </Fact>
          <Fact label="Rows">
            {formatCount(b.rowCount)} rows, numbered {b.firstRow}–{lastRow}; usually {formatCount(b.vinesPerRow)} vines per row
          </Fact>
          <Fact label="Line posts">{b.vinesPerPanel ? `${b.vinesPerPanel} vines per panel` : 'not recorded'}</Fact>
          <Fact label="Counting from">{b.positionOrigin ?? 'row end not recorded'}</Fact>
          {b.rowBearingDeg !== null && <Fact label="Row bearing">{b.rowBearingDeg}°</Fact>}
          <Fact label="Area">
            {formatAreaM2(b.areaM2, units)} planted, {formatVinesPerArea(b.rowSpacingM, b.vineSpacingM, units)}
          </Fact>
          {b.notes && <Fact label="Notes">{b.notes}</Fact>}
        </dl>
      </section>

      <section aria-labelledby="rows-heading" className="flex flex-col gap-2">
        <h2 id="rows-heading" className="text-xl font-bold">
          Rows
        </h2>
        <div className="max-h-[32rem] overflow-auto rounded-lg border-2 border-line bg-panel">
          <table className="w-full border-collapse text-left">
            <thead className="sticky top-0 bg-panel">
              <tr className="border-b-2 border-line">
                <th scope="col" className="px-3 py-2">
                  Row
                </th>
                <th scope="col" className="px-3 text-right">
                  Vines
                </th>
                <th scope="col" className="px-3 text-right">
                  Missing
                </th>
                <th scope="col" className="px-3 text-right">
                  Dead
                </th>
                <th scope="col" className="px-3 text-right">
                  Replants
                </th>
              </tr>
            </thead>
            <tbody>
              {ordered.map((r) => (
                <tr key={r.row} className={`border-b border-line ${openRow === r.row ? 'bg-rootstock-tint' : ''}`}>
                  <th scope="row" className="px-1">
                    <button
                      type="button"
                      aria-expanded={openRow === r.row}
                      onClick={() => setOpenRow(openRow === r.row ? null : r.row)}
                      className="min-h-touch px-2 font-bold whitespace-nowrap text-rootstock underline"
                    >
                      Row {r.row}
                      <span className="sr-only"> vines</span>
                    </button>
                  </th>
                  <td className="px-3 text-right tabular-nums">{r.vineCount}</td>
                  <td className="px-3 text-right tabular-nums">{r.counts.missing || ''}</td>
                  <td className="px-3 text-right tabular-nums">{r.counts.dead || ''}</td>
                  <td className="px-3 text-right tabular-nums">{r.counts.replant || ''}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {openRow !== null && (
          <RowSlots
            key={openRow}
            block={b}
            row={openRow}
            vineCount={rows.find((r) => r.row === openRow)?.vineCount ?? 0}
            canManage={canManage && !b.archivedAt}
            onClose={() => setOpenRow(null)}
          />
        )}
      </section>
    </div>
  );
}
