/**
 * A stored settings override (per organisation or per block): the shape only, each value a finite
 * number of 0 or more, ranges of whole numbers. Orders and limits between settings are checked by
 * mergeSettings (lib/viticulture/settings.ts) over the levels beneath it.
 */
import { z } from 'zod';
import { DEFAULT_SETTINGS, SETTINGS_META, type SettingKey, type SettingsOverride } from '@/lib/viticulture';

const number = z.number({ error: 'Must be a number' }).finite('Must be a finite number').min(0, 'Must be 0 or more');
const whole = number.int('Must be a whole number');
const range = z
  .object({ min: whole, max: whole })
  .strict()
  .refine((r) => r.min <= r.max, { message: 'The lowest must not exceed the highest', path: ['max'] });
const formula = z.object({ firstUnitBuds: number, perAdditionalUnitBuds: number, unit: z.enum(['lb', 'kg'], 'Must be lb or kg') }).strict();

const forKind = { number, integer: whole, range, formula } as const;

const groups = Object.fromEntries(
  Object.entries(DEFAULT_SETTINGS).map(([group, values]) => [
    group,
    z
      .object(Object.fromEntries(Object.keys(values).map((key) => [key, forKind[SETTINGS_META[`${group}.${key}` as SettingKey].kind].optional()])))
      .strict()
      .optional(),
  ]),
);

export const settingsOverrideSchema = z.object(groups).strict() as unknown as z.ZodType<SettingsOverride>;

export const settingsBodySchema = z.object({ overrides: settingsOverrideSchema }).strict();
export type SettingsBody = z.infer<typeof settingsBodySchema>;
