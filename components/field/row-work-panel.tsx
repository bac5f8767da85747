'use client';

import { useTranslations } from 'next-intl';
import { useMemo, useState } from 'react';
import { Choice } from '@/components/field/choice';
import { RowWorkForm } from '@/components/field/row-work-form';
import { cn } from '@/lib/cn';
import { readCrewDefaults, useDoneRows } from '@/lib/offline/row-work';
import { requestBackgroundSync, syncNow } from '@/lib/offline/sync';
import { ROW_WORK_PASSES, type RowWorkPass } from '@/lib/work/passes';

/**
 * The block's rows for the crew lead: which are done in the chosen pass (from the server's last
 * copy and this phone's queue, so it holds without signal), and a tap on a row to mark it done.
 */
export function RowWorkPanel({ owner, blockId, rows }: { owner: string; blockId: string; rows: { row: number; vineCount: number }[] }) {
  const t = useTranslations('work');
  const lengths = useMemo(() => new Map(rows.map((r) => [r.row, r.vineCount])), [rows]);
  const { isDone, isWaiting } = useDoneRows(blockId, lengths);
  const [pass, setPass] = useState<RowWorkPass>(() => (typeof window === 'undefined' ? undefined : readCrewDefaults(owner)?.pass) ?? 'pruning');
  const [marking, setMarking] = useState<{ row: number; vineCount: number }>();
  const [flash, setFlash] = useState<string>();

  if (marking) {
    return (
      <RowWorkForm
        owner={owner}
        blockId={blockId}
        row={marking.row}
        vineCount={marking.vineCount}
        pass={pass}
        onCancel={() => setMarking(undefined)}
        onSaved={(saved) => {
          setPass(saved);
          setFlash(t('saved', { row: marking.row, pass: t(`passes.${saved}`) }));
          setMarking(undefined);
          void syncNow();
          void requestBackgroundSync();
        }}
      />
    );
  }

  const done = rows.filter((r) => isDone(pass, r.row)).length;
  return (
    <section aria-labelledby="row-work-title" className="flex flex-col gap-3" data-testid="row-work-panel">
      <h2 id="row-work-title" className="text-xl font-bold">
        {t('title')}
      </h2>
      {flash && (
        <p role="status" className="rounded-lg bg-rootstock-tint p-2 font-bold">
          ✓ {flash}
        </p>
      )}
      <Choice<RowWorkPass>
        label={t('pass')}
        value={pass}
        options={ROW_WORK_PASSES.map((p) => ({ value: p, label: t(`passes.${p}`) }))}
        onChange={(p) => p && setPass(p)}
      />
      <p className="font-bold" aria-live="polite">
        {t('rowsDoneCount', { done, total: rows.length })}
      </p>
      <ul className="grid grid-cols-4 gap-2">
        {rows.map((r) => {
          const state = isWaiting(pass, r.row) ? 'waiting' : isDone(pass, r.row) ? 'done' : 'open';
          return (
            <li key={r.row}>
              <button
                type="button"
                onClick={() => {
                  setFlash(undefined);
                  setMarking(r);
                }}
                aria-label={state === 'open' ? t('markRow', { row: r.row }) : t(state === 'done' ? 'rowDoneLabel' : 'rowWaitingLabel', { row: r.row })}
                data-state={state}
                className={cn(
                  'flex min-h-16 w-full flex-col items-center justify-center rounded-xl border-2 font-extrabold',
                  state === 'open' ? 'border-line bg-panel' : 'border-rootstock bg-rootstock text-white',
                )}
              >
                <span className="text-xl">{r.row}</span>
                <span className="text-xs">{state === 'done' ? `✓ ${t('done')}` : state === 'waiting' ? `✓ ${t('waiting')}` : ' '}</span>
              </button>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
