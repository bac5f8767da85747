'use client';

import { useFormatter, useTranslations } from 'next-intl';
import { useEffect, useState } from 'react';
import { VineStepper } from '@/components/field/vine-stepper';
import { addressKey, useMyTasks, useQueuedDone, type PhoneTask } from '@/components/tasks/use-my-tasks';
import { Notice } from '@/components/ui/field';
import { cn } from '@/lib/cn';

const PRIORITY_STYLE = { high: 'border-alarm', normal: 'border-rootstock', low: 'border-line' } as const;

/** "My tasks" on the phone: the list, or one task walked vine by vine with the stepper. */
export function MyTasks({ owner }: { owner: string }) {
  const t = useTranslations('tasks');
  const tField = useTranslations('field');
  const format = useFormatter();
  const tasks = useMyTasks(owner);
  const [taskId, setTaskId] = useState<string | null>();
  useEffect(() => setTaskId(new URLSearchParams(window.location.search).get('task')), []);

  if (taskId === undefined || tasks.isPending) return <p>{tField('loading')}</p>;
  if (tasks.isError) return <Notice tone="warn">{t('notOnPhone')}</Notice>;

  if (taskId) {
    const task = tasks.data.tasks.find((x) => x.id === taskId);
    if (!task) return <Notice tone="warn">{t('notFound')}</Notice>;
    return (
      <div className="flex flex-col gap-2">
        <a href="/field/tasks" className="font-bold text-rootstock underline">
          ← {t('back')}
        </a>
        <VineStepper blockId={task.blockId} owner={owner} />
      </div>
    );
  }

  const day = (iso: string) => format.dateTime(new Date(`${iso}T12:00:00Z`), { dateStyle: 'medium' });
  return (
    <div className="flex flex-col gap-3">
      <h1 className="text-3xl font-extrabold">{t('title')}</h1>
      {tasks.data.offline && (
        <Notice tone="warn">{t('offlineCopy', { time: format.dateTime(new Date(tasks.data.fetchedAt), { dateStyle: 'short', timeStyle: 'short' }) })}</Notice>
      )}
      {tasks.data.tasks.length === 0 && <Notice tone="ok">{t('none')}</Notice>}
      <ul className="flex flex-col gap-3">
        {tasks.data.tasks.map((task) => (
          <TaskCard key={task.id} task={task} day={day} />
        ))}
      </ul>
    </div>
  );
}

function TaskCard({ task, day }: { task: PhoneTask; day: (iso: string) => string }) {
  const t = useTranslations('tasks');
  const queued = useQueuedDone(task.id);
  const done = task.items.filter((i) => i.status === 'done' || queued.has(addressKey(i.row, i.position))).length;
  return (
    <li className={cn('flex flex-col gap-2 rounded-xl border-4 bg-panel p-3', PRIORITY_STYLE[task.priority])} data-testid="my-task">
      <p className="text-sm font-bold text-bark-soft">
        {task.blockName} · {t(`priority.${task.priority}`)}
      </p>
      <h2 className="text-xl font-extrabold">{task.title}</h2>
      {task.note && <p>{task.note}</p>}
      {task.dueOn && (
        <p className={cn('font-bold', task.overdue && 'text-alarm')}>
          {task.overdue ? t('overdue', { date: day(task.dueOn) }) : t('due', { date: day(task.dueOn) })}
        </p>
      )}
      <p>{t('progress', { done, total: task.items.length })}</p>
      <progress className="h-3 w-full accent-rootstock" max={task.items.length} value={done} aria-hidden />
      {/* A full page load, so the service worker's copy of this page answers with no signal. */}
      <a
        href={`/field/tasks?task=${task.id}`}
        className="flex min-h-16 items-center justify-center rounded-xl bg-rootstock text-lg font-extrabold text-white no-underline"
      >
        {t('start')} ▶
      </a>
    </li>
  );
}
