/**
 * What row work costs under the organisation's pay basis. Wages, piece rates, minimum-wage top-ups
 * for piece workers and rest periods follow local law; these figures are planning estimates only.
 */
export const PAY_BASES = ['hourly', 'piece-rate'] as const;
export type PayBasisKind = (typeof PAY_BASES)[number];

export interface PayBasis {
  basis: PayBasisKind;
  /** Per person-hour. */
  hourlyRate: number | null;
  /** Per vine worked, each vine paid once per pass. */
  pieceRatePerVine: number | null;
}

export const PAY_CAUTION =
  'Wages, piece rates (and any top-up to the minimum wage for piece workers), breaks and rest periods follow local law and agreements; check them with your local labour rules. These figures are planning estimates.';

/** Cost of work done: person-hours × hourly rate, or vines × piece rate. Null when the rate is not set. */
export function workCost(pay: PayBasis, done: { personHours: number; vines: number }): number | null {
  if (pay.basis === 'hourly') return pay.hourlyRate === null ? null : done.personHours * pay.hourlyRate;
  return pay.pieceRatePerVine === null ? null : done.vines * pay.pieceRatePerVine;
}

/**
 * Cost of the whole pass: at a piece rate every standing vine is paid once; by the hour, the
 * projected person-hours (at the pace so far, else the estimate) are paid. Null when unknown.
 */
export function projectedWorkCost(pay: PayBasis, whole: { vineCount: number; projectedHours: number | null }): number | null {
  if (pay.basis === 'piece-rate') return pay.pieceRatePerVine === null ? null : whole.vineCount * pay.pieceRatePerVine;
  if (pay.hourlyRate === null || whole.projectedHours === null) return null;
  return whole.projectedHours * pay.hourlyRate;
}
