import type { BlockReport } from '@/lib/reports/block-report';
import { formatCount } from '@/lib/reports/format';
import { ListTable, Section, StockTable } from '../figure';

export function TaskSection({ report, title }: { report: BlockReport; title: string }) {
  const t = report.tasks;
  return (
    <Section id="tasks" title={title}>
      {!t.available ? (
        <p>Tasks are not set up on this server yet.</p>
      ) : t.list.length === 0 ? (
        <p>No tasks on this block belong to {report.season}.</p>
      ) : (
        <ListTable
          testId="tasks-table"
          caption={`${t.open} open, ${t.done} done${t.cancelled ? `, ${t.cancelled} cancelled` : ''}: tasks made or closed in ${report.season}, and those still open.`}
          columns={['Task', 'Status', 'Assigned to', 'Due', 'Vines done']}
          rows={t.list.map((task) => ({
            key: task.id,
            cells: [task.title, task.status, task.assignee ?? '–', task.dueOn ?? '–', `${task.itemsDone} of ${task.items}`],
          }))}
        />
      )}
    </Section>
  );
}

export function ReplantSection({ report, title }: { report: BlockReport; title: string }) {
  const r = report.replant;
  return (
    <Section id="replant" title={title} intro={`For the nursery order: ${r.how}.`}>
      {r.total === 0 ? (
        <p>No slot on this block needs a new vine.</p>
      ) : (
        <>
          <StockTable
            testId="replant-table"
            rows={r.byStock}
            caption={`${formatCount(r.total)} vines: ${r.reasons.missing} slots marked missing, ${r.reasons.dead} dead, ${r.reasons['recorded-missing'] + r.reasons['recorded-dead']} recorded missing or dead this season, ${r.reasons.flagged} flagged for replanting.`}
          />
          <details className="print:hidden">
            <summary className="min-h-touch cursor-pointer py-2 font-bold">Slots by row ({r.byRow.length} rows)</summary>
            <ul className="columns-1 text-sm sm:columns-2">
              {r.byRow.map((row) => (
                <li key={row.row}>
                  Row {row.row}: {row.positions.join(', ')}
                </li>
              ))}
            </ul>
          </details>
        </>
      )}
    </Section>
  );
}
