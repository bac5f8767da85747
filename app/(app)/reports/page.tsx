import type { Metadata } from 'next';
import { Suspense } from 'react';
import { EstateReportView } from '@/components/reports/estate-report-view';
import { memberForPage } from '@/lib/server/auth/guard';
import { loadEstateReport } from '@/lib/server/services/reports';
import { readReportOptions } from '@/lib/validation/report';

export const metadata: Metadata = { title: 'Reports' };

export default async function ReportsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const member = await memberForPage();
  const raw = await searchParams;
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(raw)) if (typeof value === 'string') search.set(key, value);
  const data = await loadEstateReport(member, readReportOptions(search));
  return (
    <Suspense>
      <EstateReportView data={data} organisationName={member.organisationName} units={member.unitSystem} seasonStartMonth={member.seasonStartMonth} />
    </Suspense>
  );
}
