'use client';

import { useQuery } from '@tanstack/react-query';
import Link from 'next/link';
import { useState } from 'react';
import { apiGet } from '@/lib/api-client';
import { Field, Input, Notice, Select } from '@/components/ui/field';
import { ScrollArea } from '@/components/ui/scroll-area';
import { cn } from '@/lib/cn';
import { formatDay } from '@/lib/grid/labels';
import type { PruningCheckReport as Report } from '@/lib/contracts/tasks';

const signed = (n: number | null, unit = '') => (n === null ? '—' : `${n > 0 ? '+' : ''}${n}${unit}`);

/** Each pruner's deviation over the vines checked: the crew lead's early warning, and the checks behind it. */
export function PruningCheckReport({ blocks }: { blocks: { id: string; name: string }[] }) {
  const [block, setBlock] = useState('');
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const search = new URLSearchParams({ ...(block ? { block } : {}), ...(from ? { from } : {}), ...(to ? { to } : {}) });
  const report = useQuery({ queryKey: ['pruning-checks', search.toString()], queryFn: () => apiGet<Report>(`/api/pruning-checks?${search}`) });
  const fine = report.data?.finePercent ?? 10;
  const names = new Map(report.data?.pruners.map((p) => [p.prunerId, p.prunerName ?? 'Unknown']) ?? []);

  return (
    <div className="flex flex-col gap-6">
      <div className="grid gap-3 sm:grid-cols-3 sm:items-end">
        <Field id="check-block" label="Block">
          <Select id="check-block" value={block} onChange={(e) => setBlock(e.target.value)}>
            <option value="">All blocks</option>
            {blocks.map((b) => (
              <option key={b.id} value={b.id}>
                {b.name}
              </option>
            ))}
          </Select>
        </Field>
        <Field id="check-from" label="From">
          <Input id="check-from" type="date" value={from} onChange={(e) => setFrom(e.target.value)} />
        </Field>
        <Field id="check-to" label="To">
          <Input id="check-to" type="date" value={to} onChange={(e) => setTo(e.target.value)} />
        </Field>
      </div>
      {report.isError && <Notice tone="error">{report.error.message}</Notice>}
      {report.isPending && <p aria-busy="true">Loading checks…</p>}
      {report.data && report.data.pruners.length === 0 && (
        <Notice>No pruning checks here yet. A crew lead or manager records them in the field: open a vine and choose “Pruning check”.</Notice>
      )}
      {report.data && report.data.pruners.length > 0 && (
        <>
          <section aria-labelledby="pruners-heading">
            <h2 id="pruners-heading" className="mb-2 text-xl font-bold">
              By pruner
            </h2>
            <p className="mb-2 text-sm text-bark-soft">
              Buds left include renewal spurs. Off target means more than {fine}% from the block’s target; the plan is each vine’s own, from its measured canes.
            </p>
            <ScrollArea label="By pruner" className="rounded-lg border-2 border-line bg-panel">
              <table className="w-full border-collapse text-left">
                <thead>
                  <tr className="border-b-2 border-line">
                    {[
                      'Pruner',
                      'Vines checked',
                      'Buds left (mean)',
                      'Against target (mean)',
                      'Off target',
                      'Renewal spurs (mean)',
                      'Against vine plan (mean)',
                    ].map((h) => (
                      <th key={h} scope="col" className="px-3 py-2 whitespace-nowrap">
                        {h}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {report.data.pruners.map((p) => {
                    const warn = (p.offTargetShare ?? 0) > 0.25 || Math.abs(p.targetDeviationMeanPercent ?? 0) > fine;
                    return (
                      <tr key={p.prunerId} className={cn('border-b border-line', warn && 'bg-cut-tint')} data-testid="pruner-row">
                        <td className="px-3 py-2 font-bold">{p.prunerName ?? 'Unknown'}</td>
                        <td className="px-3 py-2 tabular-nums">{p.vines}</td>
                        <td className="px-3 py-2 tabular-nums">{p.budsLeftMean}</td>
                        <td className="px-3 py-2 tabular-nums">{signed(p.targetDeviationMeanPercent, '%')}</td>
                        <td className="px-3 py-2 tabular-nums">{p.offTargetShare === null ? '—' : `${Math.round(p.offTargetShare * 100)}% of vines`}</td>
                        <td className="px-3 py-2 tabular-nums">{p.renewalSpursMean}</td>
                        <td className="px-3 py-2 tabular-nums">
                          {p.planChecks
                            ? `${signed(p.planDeviationMeanBuds, ' buds')}, ${signed(p.planSpurDeviationMean, ' spurs')} (${p.planChecks} vines)`
                            : '—'}
                        </td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </ScrollArea>
          </section>
          <section aria-labelledby="checks-heading">
            <h2 id="checks-heading" className="mb-2 text-xl font-bold">
              Vines checked
            </h2>
            <ul className="flex flex-col gap-1">
              {report.data.checks.map((c) => (
                <li key={c.id} className="rounded-lg border-2 border-line bg-panel p-2">
                  <Link href={`/grid/${c.blockId}?row=${c.row}&position=${c.position}`} className="font-bold text-rootstock underline">
                    {c.blockName}, row {c.row}, vine {c.position}
                  </Link>{' '}
                  · {names.get(c.prunerId)} · {c.budsLeft} buds, {c.renewalSpurs} spurs
                  {c.budTarget !== null && ` · target ${c.budTarget} (${signed(c.targetDeviationPercent, '%')})`}
                  {c.planBuds !== null && ` · plan ${c.planBuds}`} · {formatDay(c.observedAt)}
                  {c.checkedByName && <span className="text-sm text-bark-soft"> · checked by {c.checkedByName}</span>}
                </li>
              ))}
            </ul>
          </section>
        </>
      )}
    </div>
  );
}
