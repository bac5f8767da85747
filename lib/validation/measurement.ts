/**
 * A yield or pruning-weight entry: one vine, or a row sample of several vines weighed together.
 * One schema for the desk form, the route handler and the tests. Weights are typed in the
 * organisation's unit (kg or lb) and stored in kilograms.
 */
import { z } from 'zod';
import { lbToKg } from '@/lib/viticulture';

export const MEASUREMENT_KINDS = ['yield', 'pruning-weight'] as const;
export type MeasurementKind = (typeof MEASUREMENT_KINDS)[number];

export const MEASUREMENT_LABELS: Record<MeasurementKind, string> = {
  yield: 'Yield (fruit picked)',
  'pruning-weight': 'Pruning weight (one-year wood cut off)',
};

// Per vine, in kilograms: past these a slip of the unit (grams typed as kilograms) is likelier than the vine.
const MOST_KG_PER_VINE: Record<MeasurementKind, number> = { yield: 50, 'pruning-weight': 20 };

export const WEIGHT_UNITS = ['kg', 'lb'] as const;

const today = () => new Date().toISOString().slice(0, 10);

export const measurementSchema = z
  .strictObject({
    blockId: z.uuid('Choose a block'),
    kind: z.enum(MEASUREMENT_KINDS, 'Choose yield or pruning weight'),
    row: z.number('Enter the row number').int('Must be a whole number').min(0, 'Cannot be negative').max(100_000),
    // Left out (or null) for a row sample.
    position: z.number('Enter the vine number').int('Must be a whole number').min(1, 'Vines are numbered from 1').max(100_000).nullable().default(null),
    vines: z
      .number('Enter how many vines were weighed')
      .int('Must be a whole number')
      .min(1, 'At least one vine')
      .max(1000, 'At most 1000 vines in one sample')
      .default(1),
    weight: z.number('Enter the weight').min(0, 'Cannot be negative').max(100_000),
    weightUnit: z.enum(WEIGHT_UNITS, 'Choose kg or lb'),
    clusters: z.number().int('Must be a whole number').min(0, 'Cannot be negative').max(1_000_000).nullable().default(null),
    measuredOn: z.iso.date('Enter the day it was weighed'),
    note: z.string().trim().max(1000, 'At most 1000 characters').default(''),
  })
  .superRefine((m, ctx) => {
    if (m.position !== null && m.vines !== 1) {
      ctx.addIssue({ code: 'custom', path: ['vines'], message: 'A single vine is one vine; leave the vine number empty for a row sample' });
    }
    if (m.kind === 'pruning-weight' && m.weight === 0) {
      ctx.addIssue({ code: 'custom', path: ['weight'], message: 'A pruning weight must be more than 0' });
    }
    if (m.kind === 'pruning-weight' && m.clusters !== null) {
      ctx.addIssue({ code: 'custom', path: ['clusters'], message: 'Clusters belong to a yield entry' });
    }
    const kgPerVine = weightKg(m) / m.vines;
    const most = MOST_KG_PER_VINE[m.kind];
    if (kgPerVine > most) {
      ctx.addIssue({
        code: 'custom',
        path: ['weight'],
        message: `That is ${kgPerVine.toFixed(1)} kg a vine; more than ${most} kg is unlikely. Check the unit and the number of vines.`,
      });
    }
    if (m.measuredOn > today()) ctx.addIssue({ code: 'custom', path: ['measuredOn'], message: 'Cannot be in the future' });
  });

export type MeasurementInput = z.infer<typeof measurementSchema>;
export type MeasurementFormValues = z.input<typeof measurementSchema>;

/** The entered weight in kilograms, as it is stored. */
export function weightKg(m: Pick<MeasurementInput, 'weight' | 'weightUnit'>): number {
  return m.weightUnit === 'lb' ? lbToKg(m.weight) : m.weight;
}

/** A stored weight as the API answers it and the forms show it. */
export interface MeasurementView {
  id: string;
  blockId: string;
  kind: MeasurementKind;
  row: number;
  position: number | null;
  vines: number;
  weightKg: number;
  clusters: number | null;
  measuredOn: string;
  note: string;
  recordedBy: string | null;
  recordedByName: string | null;
  createdAt: string;
}

/** GET /api/measurements?blockId=&season= */
export const measurementListQuerySchema = z.strictObject({
  blockId: z.uuid('Must be the id of a block'),
  season: z.coerce.number('Must be a year').int('Must be a year').min(1900).max(2200),
});
