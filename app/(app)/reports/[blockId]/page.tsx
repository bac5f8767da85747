import type { Metadata } from 'next';
import { Suspense } from 'react';
import { BlockReportView } from '@/components/reports/block-report-view';
import { memberForPage } from '@/lib/server/auth/guard';
import { AppError } from '@/lib/server/errors';
import { loadBlockReport } from '@/lib/server/services/reports';
import { readReportOptions } from '@/lib/validation/report';
import { notFound } from 'next/navigation';

export const metadata: Metadata = { title: 'Block report' };

type Search = Record<string, string | string[] | undefined>;

function toSearch(search: Search) {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(search)) {
    for (const v of Array.isArray(value) ? value : value === undefined ? [] : [value]) params.append(key, v);
  }
  return params;
}

export default async function BlockReportPage({ params, searchParams }: { params: Promise<{ blockId: string }>; searchParams: Promise<Search> }) {
  const member = await memberForPage();
  const { blockId } = await params;
  const options = readReportOptions(toSearch(await searchParams));
  const data = await loadBlockReport(member, blockId, options).catch((err: unknown) => {
    if (err instanceof AppError && err.code === 'not-found') notFound();
    throw err;
  });
  return (
    <Suspense>
      <BlockReportView key={JSON.stringify(options)} data={data} />
    </Suspense>
  );
}
