import type { CropEstimate, LabourEstimate } from '@/lib/reports/estimates';
import { formatNumber } from '@/lib/reports/format';
import type { UnitSystem } from '@/lib/units';

export function cropPerArea(crop: CropEstimate, units: UnitSystem) {
  if (units === 'metric') return crop.tonnesPerHa === null ? '' : `${formatNumber(crop.tonnesPerHa, 1)} t/ha`;
  return crop.shortTonsPerAcre === null ? '' : `${formatNumber(crop.shortTonsPerAcre, 2)} tons/acre`;
}

export const money = (v: number) => formatNumber(v, 0);

export function labourValue(labour: LabourEstimate) {
  if (labour.hours === null || labour.cost === null) return 'needs inputs';
  return `${formatNumber(labour.hours, labour.hours < 10 ? 1 : 0)} h, cost ${money(labour.cost)}`;
}

// Long lists are cut on paper; the screen and the CSV keep them whole.
export const PRINTED_ROWS = 20;
