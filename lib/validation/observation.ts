/**
 * The observation record exactly as a device sends it to POST /api/sync (DESIGN.md, "Offline
 * sync"). One schema for the field forms, the sync route and the tests. Data fields per kind mirror
 * lib/viticulture/observations.ts, with bounds no real vine exceeds.
 */
import { z } from 'zod';
import { CANE_INJURY_CAUSES, EXPOSURES, INJURY_SEVERITIES, TRUNK_INJURY_CAUSES, VINE_STATES, WOOD_ORIGINS, type ObservationKind } from '@/lib/viticulture';
import { SYNC_BATCH_LIMIT } from '@/lib/contracts/sync';

const count = (max: number) => z.number().int('Must be a whole number').min(0, 'Cannot be negative').max(max, `At most ${max}`);
const mm = (max: number) => z.number().positive('Must be more than 0').max(max, `At most ${max} mm`);

export const observationDataSchemas = {
  'cane-diameter': z.strictObject({
    diameterMm: mm(40),
    longestInternodeMm: mm(400).optional(),
    exposure: z.enum(EXPOSURES).optional(),
    colourGood: z.boolean().optional(),
    flat: z.boolean().optional(),
    origin: z.enum(WOOD_ORIGINS).optional(),
    injured: z.boolean().optional(),
  }),
  'shade-cane': z.strictObject({
    longestInternodeMm: mm(400),
    exposure: z.enum(EXPOSURES),
    colourGood: z.boolean(),
    diameterMm: mm(40).optional(),
  }),
  'weak-budbreak': z
    .strictObject({ budsRetained: count(2000), budsPushed: count(4000) })
    .refine((d) => d.budsPushed <= d.budsRetained, { message: 'Buds pushed cannot exceed buds retained', path: ['budsPushed'] }),
  'trunk-injury': z.strictObject({
    cause: z.enum(TRUNK_INJURY_CAUSES),
    severity: z.enum(INJURY_SEVERITIES),
    girdlingPercent: z.number().min(0, 'Cannot be negative').max(100, 'At most 100%'),
  }),
  'cane-injury': z.strictObject({
    cause: z.enum(CANE_INJURY_CAUSES),
    canesAffected: count(100),
    severity: z.enum(INJURY_SEVERITIES),
  }),
  'missing-vine': z.strictObject({ state: z.enum(VINE_STATES) }),
  'bud-injury': z
    .strictObject({ budsCut: count(10000).min(1, 'Cut at least one bud'), primariesDead: count(10000) })
    .refine((d) => d.primariesDead <= d.budsCut, { message: 'Dead primaries cannot exceed buds cut', path: ['primariesDead'] }),
  'pruning-record': z.strictObject({
    canesKept: count(20),
    budsPerCane: count(40),
    renewalSpurs: count(20),
    pruningWeightKg: z.number().min(0).max(20, 'At most 20 kg').optional(),
    budTarget: count(500).optional(),
  }),
  'pruning-check': z.strictObject({
    prunedBy: z.uuid('Choose the pruner whose work you checked'),
    canesKept: count(20),
    budsOnCanes: count(500),
    renewalSpurs: count(20),
    budTarget: count(500).optional(),
  }),
  note: z.strictObject({}),
} satisfies Record<ObservationKind, z.ZodType>;

const kinds = Object.keys(observationDataSchemas) as [ObservationKind, ...ObservationKind[]];

export const observationRecordSchema = z
  .strictObject({
    id: z.uuid({ version: 'v4', message: 'Must be a UUID v4 made on the device' }),
    blockId: z.uuid('Must be a block id'),
    row: z.number().int().min(1, 'Rows start at 1').max(10000),
    position: z.number().int().min(1, 'Positions start at 1').max(10000),
    kind: z.enum(kinds, 'Unknown observation kind'),
    data: z.record(z.string(), z.unknown()),
    note: z.string().max(2000, 'Notes are limited to 2,000 characters').default(''),
    observedAt: z.iso.datetime({ offset: true, message: 'Must be an ISO 8601 time' }),
  })
  .superRefine((record, ctx) => {
    const parsed = observationDataSchemas[record.kind].safeParse(record.data);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) ctx.addIssue({ ...issue, path: ['data', ...issue.path] } as never);
    }
    const observed = Date.parse(record.observedAt);
    // A little slack for phone clocks that run fast.
    if (observed > Date.now() + 24 * 3600 * 1000) ctx.addIssue({ code: 'custom', message: 'Cannot be in the future', path: ['observedAt'] });
  });

export type ObservationRecord = z.infer<typeof observationRecordSchema>;

export const syncRequestSchema = z.strictObject({
  observations: z.array(z.unknown()).max(SYNC_BATCH_LIMIT, `At most ${SYNC_BATCH_LIMIT} records per request`),
});
