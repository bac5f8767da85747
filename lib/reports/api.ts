/** What the report routes answer, for the pages that read them. */
import type { BlockReport } from './block-report';
import type { Comparison } from './compare';
import type { EstateReport } from './estate-report';

export interface BlockReportResponse {
  report: BlockReport;
  comparison: Comparison | null;
  seasons: number[];
}

export type EstateReportResponse = EstateReport & { seasons: number[] };
