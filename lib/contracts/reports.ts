/** Reports and measurements: what /api/reports/** and /api/measurements/** answer. */
import type { MeasurementView } from '@/lib/validation/measurement';

export type { BlockReportResponse, EstateReportResponse } from '@/lib/reports/api';
export type { MeasurementView };

export interface MeasurementList {
  measurements: MeasurementView[];
}

export interface MeasurementOne {
  measurement: MeasurementView;
}
