import type { BlockReport } from '@/lib/reports/block-report';
import { formatAreaM2, formatLengthM, formatCount } from '@/lib/units';
import { Section } from '../figure';

export function MethodSection({ report, title }: { report: BlockReport; title: string }) {
  return (
    <Section id="method" title={title}>
      <ul className="flex max-w-3xl list-disc flex-col gap-1 pl-5 text-sm">
        <li>
          The season is {report.season}: records observed from {report.period.from.slice(0, 10)} up to {report.period.to.slice(0, 10)} (UTC). Deleted records
          never count; closed ones do, since this is the season&apos;s history.
        </li>
        <li>A vine is scouted when it has any record in the season; it has a problem when its worst finding of that kind is at least &quot;watch&quot;.</li>
        <li>
          Pruning records and pruning checks are records of the work, not findings: they are reported as the buds kept against the target, never as an
          incidence.
        </li>
        <li>Budbreak, pruning records and bud-injury targets use each vine&apos;s latest record; canes count one per record.</li>
        <li>
          Shares carry the range they probably lie in, 95% of the time (the Wilson score interval). Under each figure, &quot;How this is worked out&quot; gives
          the sum with its inputs and names the published source, or says where a value has none.
        </li>
        <li>The records behind this report are in the CSV export (columns described on the export page).</li>
      </ul>
    </Section>
  );
}

export function BlockFacts({ report }: { report: BlockReport }) {
  const b = report.block;
  const s = report.slots;
  return (
    <p className="text-bark-soft" data-testid="block-facts">
      {b.variety}
      {b.clone ? `, clone ${b.clone}` : ''}
      {b.rootstock ? ` on ${b.rootstock}` : ''}
      {b.plantingYear ? `, planted ${b.plantingYear}` : ''}; {b.trainingSystem}-pruned; rows {formatLengthM(b.rowSpacingM, report.units)} apart, vines{' '}
      {formatLengthM(b.vineSpacingM, report.units)}; {formatCount(b.rowCount)} rows, {formatCount(s.total)} slots ({formatAreaM2(b.areaM2, report.units)}):{' '}
      {formatCount(s.planted)} planted, {formatCount(s.replant)} replants, {formatCount(s.missing)} missing, {formatCount(s.dead)} dead.
    </p>
  );
}
