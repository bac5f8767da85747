import Link from 'next/link';
import { formatCount } from '@/lib/units';
import { formatDay, formatMoney, formatPace, overEstimate } from '@/lib/work/format';
import { PASS_LABELS, type RowWorkPass } from '@/lib/work/passes';
import type { BlockProgress } from '@/lib/work/progress';

const SHOWN: RowWorkPass[] = ['pruning', 'brush-removal', 'tying'];

/** Every block's winter work at a glance; each block links to its progress page. */
export function EstateProgressTable({ blocks, season }: { blocks: BlockProgress[]; season: number }) {
  const pass = (b: BlockProgress, p: RowWorkPass) => b.passes.find((x) => x.pass === p)!;
  const total = (b: BlockProgress) => b.passes.reduce((s, p) => (p.costToDate === null || s === null ? null : s + p.costToDate), 0 as number | null);
  return (
    <div className="overflow-x-auto" role="region" aria-label="Progress by block" tabIndex={0}>
      <table className="w-full min-w-[640px] text-left" data-testid="estate-progress">
        <caption className="sr-only">Row work per block, season {season}</caption>
        <thead>
          <tr className="border-b-2 border-bark">
            <th scope="col" className="p-2">
              Block
            </th>
            {SHOWN.map((p) => (
              <th key={p} scope="col" className="p-2 text-right">
                {PASS_LABELS[p]} rows
              </th>
            ))}
            <th scope="col" className="p-2 text-right">
              Pruning pace
            </th>
            <th scope="col" className="p-2">
              Pruning finish
            </th>
            <th scope="col" className="p-2 text-right">
              Cost to date
            </th>
            <th scope="col" className="p-2 text-right">
              Pruning projected
            </th>
          </tr>
        </thead>
        <tbody>
          {blocks.map((b) => {
            const pruning = pass(b, 'pruning');
            const behind = overEstimate(pruning.projectedHours, pruning.estimatedHours);
            return (
              <tr key={b.block.id} className="border-b border-line" data-testid="estate-row">
                <th scope="row" className="p-2">
                  <Link href={`/work/${b.block.id}?season=${season}`}>{b.block.name}</Link>
                </th>
                {SHOWN.map((p) => (
                  <td key={p} className="p-2 text-right">
                    {formatCount(pass(b, p).rowsDone)} / {formatCount(pass(b, p).rowCount)}
                  </td>
                ))}
                <td className="p-2 text-right">{formatPace(pruning.vinesPerPersonHour)}</td>
                <td className="p-2">
                  {formatDay(pruning.projectedFinish)}
                  {behind && <strong className="ml-2 rounded bg-alarm-tint px-1 text-alarm">behind</strong>}
                </td>
                <td className="p-2 text-right">{formatMoney(total(b))}</td>
                <td className="p-2 text-right">{formatMoney(pruning.projectedCost)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
