'use client';

import { useQuery } from '@tanstack/react-query';
import { useFormatter, useTranslations } from 'next-intl';
import { useCallback, useEffect, useMemo, useState } from 'react';
import dynamic from 'next/dynamic';
import type { SavedObservation } from '@/components/field/observation-form';
import { FieldSettingsProvider } from '@/components/field/field-settings';
import { ReiWarning } from '@/components/field/rei-warning';
import { TaskStep } from '@/components/tasks/task-step';
import { useMyTasks } from '@/components/tasks/use-my-tasks';
import { Notice } from '@/components/ui/field';
import { toPostAddress } from '@/lib/address';
import { cn } from '@/lib/cn';
import { enqueueObservation, enqueuePhoto, listObservations, onOutboxChange } from '@/lib/offline/outbox';
import { useDoneRows } from '@/lib/offline/row-work';
import { requestBackgroundSync, syncNow } from '@/lib/offline/sync';
import { STATUS_BY_LETTER, useFieldLayout, type FieldLayout } from '@/lib/offline/use-field-layout';
import { can, type Role } from '@/lib/roles';
import { OBSERVATION_KINDS, type ObservationKind } from '@/lib/viticulture';
import { ROW_WORK_PASSES } from '@/lib/work/passes';
import { apiGet } from '@/lib/api-client';
import type { Me } from '@/lib/contracts/people';
import type { FieldVineHistory } from '@/lib/contracts/field';

// The forms (and the validation and calculation code they carry) load when a kind is tapped; the
// service worker precaches the chunk, so this works offline too.
const loadObservationForm = () => import('@/components/field/observation-form');
const loadFlagForm = () => import('@/components/flags/flag-form');
const ObservationForm = dynamic(() => loadObservationForm().then((m) => m.ObservationForm));
const FlagForm = dynamic(() => loadFlagForm().then((m) => m.FlagForm));
const loadRowWorkForm = () => import('@/components/field/row-work-form');
const RowWorkForm = dynamic(() => loadRowWorkForm().then((m) => m.RowWorkForm));

const FORMS_PREFETCH_DELAY_MS = 4000;

interface Address {
  row: number;
  position: number;
}

const SEVERITY_STYLE = ['border-line', 'border-cut', 'border-alarm', 'border-alarm bg-alarm-tint'];

function readAddress(): { address?: Address; planId?: string; taskId?: string } {
  const q = new URLSearchParams(window.location.search);
  const planId = q.get('plan') ?? undefined;
  const taskId = q.get('task') ?? undefined;
  const row = Number(q.get('row'));
  const position = Number(q.get('position'));
  return { planId, taskId, address: row > 0 && position > 0 ? { row, position } : undefined };
}

/** Queued records of this phone for one vine, kept live as the outbox changes. */
function useQueuedHere(blockId: string, at: Address | undefined) {
  const [count, setCount] = useState(0);
  useEffect(() => {
    if (!at) return;
    const load = () =>
      void listObservations().then((all) =>
        setCount(all.filter((e) => e.record.blockId === blockId && e.record.row === at.row && e.record.position === at.position).length),
      );
    load();
    return onOutboxChange(load);
  }, [blockId, at]);
  return count;
}

export function VineStepper({
  blockId,
  owner,
  initialLayout,
  initialAddress,
  role,
}: {
  blockId: string;
  owner: string;
  /** The person's role as the page knew it, so the buttons it allows are in the first paint. */
  role?: Role;
  /** The server's render of the layout and the address in the link: the vine in the first paint. */
  initialLayout?: FieldLayout;
  initialAddress?: Address;
}) {
  const t = useTranslations();
  const { data: layout, isPending, isError } = useFieldLayout(blockId, initialLayout);
  const [at, setAt] = useState<Address | undefined>(initialAddress);
  const [planId, setPlanId] = useState<string>();
  const [taskId, setTaskId] = useState<string>();
  const [flagging, setFlagging] = useState(false);
  const [markingRow, setMarkingRow] = useState(false);
  const [kind, setKind] = useState<ObservationKind>();
  const [flash, setFlash] = useState<string>();
  const [jump, setJump] = useState('');

  // Fetch the forms while there is signal, once the page has settled: a scout who loses signal
  // before the service worker has cached them can still record. Not sooner, so that running their
  // code never competes with the first taps on a slow phone.
  useEffect(() => {
    let timer: number | undefined;
    const fetchForms = () => void Promise.all([loadObservationForm(), loadFlagForm(), loadRowWorkForm()]).catch(() => undefined);
    const idle = () => (window.requestIdleCallback ? window.requestIdleCallback(fetchForms, { timeout: 5000 }) : fetchForms());
    const settle = () => (timer = window.setTimeout(idle, FORMS_PREFETCH_DELAY_MS));
    if (document.readyState === 'complete') settle();
    else window.addEventListener('load', settle, { once: true });
    return () => {
      window.removeEventListener('load', settle);
      window.clearTimeout(timer);
    };
  }, []);

  useEffect(() => {
    const initial = readAddress();
    setPlanId(initial.planId);
    setTaskId(initial.taskId);
    setAt(initial.address);
  }, []);

  const plan = useMemo(() => layout?.plans.find((p) => p.id === planId), [layout, planId]);
  useEffect(() => {
    if (plan && !at) setAt(plan.addresses[0]);
  }, [plan, at]);
  // A task walks its own vines, in the order the task lists them, starting at the first still to do.
  const myTasks = useMyTasks(owner, !!taskId);
  const task = useMemo(() => myTasks.data?.tasks.find((x) => x.id === taskId), [myTasks.data, taskId]);
  useEffect(() => {
    if (task && !at) setAt(task.items.find((i) => i.status === 'open') ?? task.items[0]);
  }, [task, at]);
  const route: Address[] | undefined = plan?.addresses ?? task?.items;
  const me = useQuery({
    queryKey: ['me'],
    networkMode: 'always',
    staleTime: 5 * 60_000,
    queryFn: async () => (await apiGet<Me>('/api/me')).role,
    initialData: role,
  });

  const rowOf = useCallback((row: number) => layout?.rows.find((r) => r.row === row), [layout]);
  const rowLengths = useMemo(() => new Map(layout?.rows.map((r) => [r.row, r.vineCount])), [layout]);
  const work = useDoneRows(blockId, rowLengths);

  const moveTo = useCallback(
    (next: Address) => {
      setAt(next);
      setKind(undefined);
      setMarkingRow(false);
      const q = new URLSearchParams({ row: String(next.row), position: String(next.position) });
      if (planId) q.set('plan', planId);
      if (taskId) q.set('task', taskId);
      window.history.replaceState(null, '', `?${q}`);
    },
    [planId, taskId],
  );

  const step = useCallback(
    (delta: 1 | -1) => {
      if (!at || !layout) return;
      if (route) {
        const i = route.findIndex((a) => a.row === at.row && a.position === at.position);
        const next = route[i + delta];
        if (next) moveTo({ row: next.row, position: next.position });
        return;
      }
      const row = rowOf(at.row);
      if (!row) return;
      const position = at.position + delta;
      if (position >= 1 && position <= row.vineCount) moveTo({ row: at.row, position });
    },
    [at, layout, route, rowOf, moveTo],
  );

  const queuedHere = useQueuedHere(blockId, at);
  const history = useQuery({
    queryKey: ['vine', blockId, at?.row, at?.position],
    enabled: !!at,
    networkMode: 'always',
    queryFn: () => apiGet<FieldVineHistory>(`/api/field/blocks/${blockId}/vine?row=${at!.row}&position=${at!.position}`),
  });

  if (taskId && myTasks.isFetched && !task) return <Notice tone="warn">{t('tasks.notFound')}</Notice>;
  if (isPending) return <p>{t('field.loading')}</p>;
  if (isError || !layout) return <Notice tone="warn">{t('field.offlineNoBlock')}</Notice>;
  if (!at) return <p>{t('field.loading')}</p>;

  const row = rowOf(at.row);
  const letter = row?.statuses[at.position - 1] as keyof typeof STATUS_BY_LETTER | undefined;
  const status = letter ? STATUS_BY_LETTER[letter] : undefined;
  const finding = layout.findings.find(([r, p]) => r === at.row && p === at.position);
  const panel = layout.block.vinesPerPanel;
  const post = panel ? toPostAddress(at.row, at.position, panel) : undefined;
  const planIndex = plan ? plan.addresses.findIndex((a) => a.row === at.row && a.position === at.position) : -1;
  const nextInPlan = plan ? plan.addresses[planIndex + 1] : undefined;
  // "Row done" belongs at the end of a row walked in order, for those who record row work.
  const atRowEnd = !route && !!row && at.position === row.vineCount && !!me.data && can(me.data, 'record-row-work');
  const donePasses = ROW_WORK_PASSES.filter((p) => work.isDone(p, at.row));

  async function save(saved: SavedObservation, next: boolean) {
    const id = crypto.randomUUID();
    await enqueueObservation(owner, {
      id,
      blockId,
      row: at!.row,
      position: at!.position,
      kind: kind!,
      data: saved.data,
      note: saved.note,
      observedAt: new Date().toISOString(),
    });
    for (const photo of saved.photos) {
      await enqueuePhoto({
        id: photo.id,
        owner,
        observationId: id,
        blob: photo.blob,
        contentType: 'image/jpeg',
        bytes: photo.blob.size,
        takenAt: new Date().toISOString(),
      });
    }
    setFlash(t('form.saved'));
    setKind(undefined);
    void syncNow();
    void requestBackgroundSync();
    if (next) step(1);
  }

  return (
    <div className="flex flex-col gap-3 pb-24">
      <ReiWarning sprays={layout.sprays} />
      <header className={cn('rounded-xl border-4 bg-panel p-3', SEVERITY_STYLE[finding?.[2] ?? 0])} data-testid="vine-address">
        <p className="text-sm font-bold text-bark-soft">{layout.block.name}</p>
        <p className="text-3xl font-extrabold" aria-live="polite">
          {t('field.address', { row: at.row, position: at.position })}
        </p>
        {post && <p className="text-lg">{t('field.postAddress', { post: post.post, vine: post.vine })}</p>}
        {plan && <p className="font-bold">{t('field.planStep', { index: planIndex + 1, total: plan.addresses.length, name: plan.name })}</p>}
        <p className="mt-1">
          <span className={cn('font-bold', status && status !== 'planted' && 'text-alarm')}>{status ? t(`field.status.${status}`) : ''}</span>
          {' · '}
          {t('field.openFindings', { count: finding?.[3] ?? 0 })}
          {finding ? ` (${t('field.worst', { label: t(`field.severity.${finding[2]}`) })})` : ''}
        </p>
        {queuedHere > 0 && <p className="text-sm text-cut">{t('field.waitingHere', { count: queuedHere })}</p>}
      </header>

      {flash && !kind && !flagging && !markingRow && (
        <p role="status" className="rounded-lg bg-rootstock-tint p-2 font-bold">
          ✓ {flash}
        </p>
      )}

      {markingRow && row ? (
        <RowWorkForm
          owner={owner}
          blockId={blockId}
          row={at.row}
          vineCount={row.vineCount}
          onCancel={() => setMarkingRow(false)}
          onSaved={(pass) => {
            setMarkingRow(false);
            setFlash(t('work.saved', { row: at.row, pass: t(`work.passes.${pass}`) }));
            void syncNow();
            void requestBackgroundSync();
          }}
        />
      ) : kind ? (
        <FieldSettingsProvider settings={layout.settings} vineSpacingM={layout.block.vineSpacingM}>
          <ObservationForm kind={kind} imperial={layout.block.unitSystem === 'imperial'} onSave={save} onCancel={() => setKind(undefined)} />
        </FieldSettingsProvider>
      ) : flagging ? (
        <FlagForm
          owner={owner}
          blockId={blockId}
          row={at.row}
          position={at.position}
          lastPosition={row?.vineCount ?? at.position}
          onCancel={() => setFlagging(false)}
          onSaved={() => {
            setFlagging(false);
            setFlash(t('flag.saved'));
            void syncNow();
            void requestBackgroundSync();
          }}
        />
      ) : (
        <>
          {atRowEnd && (
            <section aria-label={t('work.title')} className="flex flex-col gap-2 rounded-xl border-2 border-rootstock bg-panel p-3" data-testid="row-end">
              <p className="font-bold">{t('work.endOfRowPrompt', { row: at.row })}</p>
              {donePasses.map((p) => (
                <p key={p} className="text-sm font-bold text-rootstock">
                  ✓ {t('work.doneInPass', { row: at.row, pass: t(`work.passes.${p}`) })}
                </p>
              ))}
              <button
                type="button"
                onClick={() => {
                  setFlash(undefined);
                  setMarkingRow(true);
                }}
                className="flex min-h-20 w-full items-center justify-center rounded-xl bg-rootstock px-2 text-xl font-extrabold text-white"
              >
                ✓ {t('work.rowDone')}
              </button>
            </section>
          )}
          {task && <TaskStep owner={owner} task={task} row={at.row} position={at.position} onDone={() => step(1)} />}
          {me.data && can(me.data, 'flag-vine') && (
            <button
              type="button"
              onClick={() => {
                setFlash(undefined);
                setFlagging(true);
              }}
              className="flex min-h-16 w-full items-center justify-center gap-2 rounded-xl border-2 border-cut bg-cut-tint px-2 text-lg font-extrabold"
            >
              ⚑ {t('field.flag')}
            </button>
          )}
          <section aria-label={t('field.record')}>
            <ul className="grid grid-cols-2 gap-2">
              {OBSERVATION_KINDS.filter((k) => k !== 'pruning-check' || (me.data && can(me.data, 'check-pruning'))).map((k) => (
                <li key={k}>
                  <button
                    type="button"
                    onClick={() => {
                      setFlash(undefined);
                      setKind(k);
                    }}
                    className="flex min-h-16 w-full items-center justify-center rounded-xl border-2 border-rootstock bg-panel px-2 text-center font-bold"
                  >
                    {t(`kinds.${k}`)}
                  </button>
                </li>
              ))}
            </ul>
          </section>
          {plan && nextInPlan && (
            <p className="rounded-lg bg-panel p-2 font-bold">
              {panel
                ? t('field.planDirections', { ...toPostAddress(nextInPlan.row, nextInPlan.position, panel) })
                : t('field.planDirectionsNoPost', { ...nextInPlan })}
            </p>
          )}
          <form
            className="flex items-end gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              const position = Number(jump);
              if (row && position >= 1 && position <= row.vineCount) moveTo({ row: at.row, position });
              setJump('');
            }}
          >
            <label className="flex flex-1 flex-col font-bold">
              {t('field.jumpTo')}
              <input
                value={jump}
                onChange={(e) => setJump(e.target.value)}
                inputMode="numeric"
                pattern="[0-9]*"
                className="min-h-touch rounded-lg border-2 border-line bg-panel px-3"
              />
            </label>
            <button type="submit" className="min-h-touch rounded-lg border-2 border-rootstock px-4 font-bold text-rootstock">
              {t('field.go')}
            </button>
          </form>
          <VineHistory items={history.data?.observations} />
        </>
      )}

      {!kind && !flagging && !markingRow && (
        <nav className="fixed inset-x-0 bottom-[var(--places-h,0px)] z-10 border-t-2 border-line bg-ground p-2" aria-label="Vines" data-sticky-bottom>
          <div className="mx-auto grid max-w-md grid-cols-2 gap-2">
            <button
              type="button"
              onClick={() => step(-1)}
              className="min-h-16 rounded-xl border-2 border-rootstock bg-panel text-xl font-extrabold text-rootstock"
            >
              ◀ {t('field.previous')}
            </button>
            <button type="button" onClick={() => step(1)} className="min-h-16 rounded-xl bg-rootstock text-xl font-extrabold text-white">
              {t('field.next')} ▶
            </button>
          </div>
        </nav>
      )}
    </div>
  );
}

function VineHistory({ items }: { items?: { id: string; kind: ObservationKind; severity: number; observedAt: string; note: string }[] }) {
  const t = useTranslations();
  const format = useFormatter();
  return (
    <section>
      <h2 className="mb-1 text-lg font-bold">{t('field.history')}</h2>
      {!items?.length ? (
        <p className="text-bark-soft">{t('field.noHistory')}</p>
      ) : (
        <ul className="flex flex-col gap-1">
          {items.map((o) => (
            <li key={o.id} className={cn('rounded-lg border-l-8 bg-panel p-2', SEVERITY_STYLE[o.severity])}>
              <span className="font-bold">{t(`kinds.${o.kind}`)}</span> · {format.dateTime(new Date(o.observedAt), { dateStyle: 'medium' })} ·{' '}
              {t(`field.severity.${o.severity}`)}
              {o.note && <p className="text-sm">{o.note}</p>}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
