'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { formatAddress } from '@/lib/address';
import { cn } from '@/lib/cn';
import type { BlockView, SlotDetail, SlotList, SlotView } from '@/lib/contracts/blocks';
import { LETTER_OF, SLOT_STATUSES, type SlotStatus } from '@/lib/validation/block';
import { apiGet, apiSend } from '@/lib/api-client';
import { STATUS_STYLE } from './status';

const ACTION_LABEL: Record<SlotStatus, string> = { planted: 'Planted', missing: 'Missing', dead: 'Dead', replant: 'Replant' };

/** The slots of one row, grouped by panel, with the slot editor for managers. */
export function RowSlots({
  block,
  row,
  vineCount,
  canManage,
  onClose,
}: {
  block: BlockView;
  row: number;
  vineCount: number;
  canManage: boolean;
  onClose: () => void;
}) {
  const [selected, setSelected] = useState<number | null>(null);
  const slots = useQuery({
    queryKey: ['block', block.id, 'row', row],
    queryFn: () => apiGet<SlotList>(`/api/blocks/${block.id}/positions?row=${row}`),
  });
  const panel = block.vinesPerPanel ?? 10;
  const positions = slots.data?.positions ?? [];
  const panels: SlotView[][] = [];
  for (let i = 0; i < positions.length; i += panel) panels.push(positions.slice(i, i + panel));

  return (
    <section aria-labelledby={`row-${row}-heading`} className="flex flex-col gap-3 rounded-2xl border-2 border-rootstock bg-panel p-3 sm:p-4">
      <div className="flex items-center justify-between gap-2">
        <h3 id={`row-${row}-heading`} className="text-lg font-bold">
          Row {row}: {vineCount} vines
        </h3>
        <Button variant="quiet" onClick={onClose}>
          Close row
        </Button>
      </div>
      {block.positionOrigin && <p className="text-sm text-bark-soft">Counting from: {block.positionOrigin}</p>}
      {canManage && <RowLength blockId={block.id} row={row} vineCount={vineCount} />}
      {slots.isPending && <p aria-busy="true">Loading the vines…</p>}
      {slots.isError && <Notice tone="error">{slots.error.message}</Notice>}
      <ol className="flex flex-wrap gap-x-4 gap-y-2" aria-label={`Vines of row ${row}`}>
        {panels.map((vines, i) => (
          <li key={i} className="flex flex-col gap-0.5">
            <span className="text-xs font-bold text-bark-soft">{block.vinesPerPanel ? `Post ${i + 1}` : `From vine ${i * panel + 1}`}</span>
            <span className="flex flex-wrap gap-1">
              {vines.map((s) => (
                <button
                  key={s.position}
                  type="button"
                  onClick={() => setSelected(s.position)}
                  aria-pressed={selected === s.position}
                  className={cn(
                    'flex size-12 flex-col items-center justify-center rounded-md border-2 text-xs leading-tight font-bold',
                    STATUS_STYLE[s.status],
                    selected === s.position && 'outline-3 outline-offset-1 outline-cut',
                  )}
                >
                  {/* Named by its content, starting with the number shown, so "click 7" works by voice (WCAG 2.5.3). */}
                  <span>{s.position}</span>
                  <span aria-hidden="true">{LETTER_OF[s.status]}</span>
                  <span className="sr-only">{`: ${formatAddress(row, s.position, block.vinesPerPanel)}: ${s.status}`}</span>
                </button>
              ))}
            </span>
          </li>
        ))}
      </ol>
      <p className="text-sm text-bark-soft">P planted · M missing · D dead · R replant</p>
      {selected !== null && (
        // Sticks to the bottom of the screen while the row scrolls, so the next vine is one tap away.
        <div className="sticky bottom-0 z-10 -mx-1 max-h-[60vh] overflow-y-auto rounded-t-2xl border-2 border-rootstock bg-panel p-3 shadow-[0_-4px_12px_rgba(0,0,0,0.15)]">
          <SlotEditor key={selected} block={block} row={row} position={selected} canManage={canManage} onClose={() => setSelected(null)} />
        </div>
      )}
    </section>
  );
}

function RowLength({ blockId, row, vineCount }: { blockId: string; row: number; vineCount: number }) {
  const queryClient = useQueryClient();
  const [value, setValue] = useState(String(vineCount));
  const save = useMutation({
    mutationFn: () => apiSend('PATCH', `/api/blocks/${blockId}/rows/${row}`, { vineCount: Number(value) }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['block', blockId] }),
  });
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
    >
      <Field id={`row-${row}-length`} label={`Vines in row ${row}`} error={save.isError ? save.error.message : undefined}>
        <Input id={`row-${row}-length`} type="number" inputMode="numeric" min={1} className="w-32" value={value} onChange={(e) => setValue(e.target.value)} />
      </Field>
      <Button type="submit" variant="secondary" disabled={save.isPending || Number(value) === vineCount}>
        Save row length
      </Button>
    </form>
  );
}

function SlotEditor({
  block,
  row,
  position,
  canManage,
  onClose,
}: {
  block: BlockView;
  row: number;
  position: number;
  canManage: boolean;
  onClose: () => void;
}) {
  const queryClient = useQueryClient();
  const url = `/api/blocks/${block.id}/positions/${row}/${position}`;
  const detail = useQuery({ queryKey: ['block', block.id, 'slot', row, position], queryFn: () => apiGet<SlotDetail>(url) });
  const [year, setYear] = useState(String(new Date().getFullYear()));
  const [clone, setClone] = useState(block.clone ?? '');
  const [rootstock, setRootstock] = useState(block.rootstock ?? '');
  const change = useMutation({
    mutationFn: (status: SlotStatus) =>
      apiSend<SlotDetail>('PATCH', url, {
        status,
        year: year ? Number(year) : null,
        clone: status === 'replant' ? clone : null,
        rootstock: status === 'replant' ? rootstock : null,
      }),
    onSuccess: (data) => {
      queryClient.setQueryData(['block', block.id, 'slot', row, position], data);
      void queryClient.invalidateQueries({ queryKey: ['block', block.id] });
    },
  });
  const slot = detail.data?.slot;
  return (
    <section aria-label="Selected vine" className="flex flex-col gap-3">
      <div className="flex items-start justify-between gap-2">
        <div>
          <h4 className="text-lg font-bold">{formatAddress(row, position, block.vinesPerPanel)}</h4>
          <p className="text-sm text-bark-soft">
            {block.vinesPerPanel ? `Vine ${position} of the row. ` : ''}
            {slot ? (
              <>
                Now <strong className="text-bark">{slot.status}</strong>
                {slot.replantYear ? `, replanted ${slot.replantYear}` : ''}.
              </>
            ) : null}
          </p>
        </div>
        <Button variant="quiet" onClick={onClose} className="px-2">
          Close
        </Button>
      </div>
      {detail.isError && <Notice tone="error">{detail.error.message}</Notice>}
      {canManage && (
        <>
          <div className="grid grid-cols-2 gap-2 sm:grid-cols-4" role="group" aria-label="Set the status">
            {SLOT_STATUSES.map((s) => (
              <Button key={s} variant={slot?.status === s ? 'primary' : 'secondary'} disabled={change.isPending} onClick={() => change.mutate(s)}>
                {ACTION_LABEL[s]}
              </Button>
            ))}
          </div>
          {change.isError && <Notice tone="error">{change.error.message}</Notice>}
          <div className="grid grid-cols-3 gap-2">
            <Field id="slot-year" label="Year">
              <Input id="slot-year" type="number" inputMode="numeric" value={year} onChange={(e) => setYear(e.target.value)} />
            </Field>
            <Field id="slot-clone" label="Clone">
              <Input id="slot-clone" value={clone} onChange={(e) => setClone(e.target.value)} />
            </Field>
            <Field id="slot-rootstock" label="Rootstock">
              <Input id="slot-rootstock" value={rootstock} onChange={(e) => setRootstock(e.target.value)} />
            </Field>
          </div>
          <p className="text-sm text-bark-soft">The year a replant went in, or the year a vine was lost. Clone and rootstock are for replants.</p>
        </>
      )}
      {detail.data && (
        <div>
          <h5 className="font-bold">Vines that stood here</h5>
          {detail.data.vines.length === 0 ? (
            <p className="text-bark-soft">No vine recorded.</p>
          ) : (
            <ul className="list-disc pl-5">
              {detail.data.vines.map((v, i) => (
                <li key={i}>
                  Planted {v.plantingYear ?? '(year not recorded)'}
                  {v.clone || v.rootstock ? `, ${v.clone ?? '?'} on ${v.rootstock ?? '?'}` : ''}
                  {v.removedYear ? ` — ${v.removalReason ?? 'gone'} ${v.removedYear}` : ' — standing'}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
