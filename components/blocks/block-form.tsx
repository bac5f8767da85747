'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Controller, useForm, type FieldPath } from 'react-hook-form';
import { Button, ButtonLink } from '@/components/ui/button';
import { Field, Input, Notice, Select } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import type { BlockOne, BlockView } from '@/lib/contracts/blocks';
import { formatAreaM2, formatCount, formatVinesPerArea, type UnitSystem } from '@/lib/units';
import { blockSchema, TRAINING_SYSTEMS, type BlockFormValues, type BlockInput } from '@/lib/validation/block';
import { apiSend, ApiError } from '@/lib/api-client';
import { LengthInput } from './length-input';
import { useHydrated } from './use-hydrated';

const TRAINING_CHOICES = { cane: 'Cane', spur: 'Spur', other: 'Other' } as const;

const NEW_BLOCK: Partial<BlockFormValues> = { trainingSystem: 'cane', rowOrder: 'ascending', firstRow: 1 };

function valuesOf(b: BlockView): BlockFormValues {
  return {
    name: b.name,
    variety: b.variety,
    clone: b.clone,
    rootstock: b.rootstock,
    plantingYear: b.plantingYear,
    trainingSystem: b.trainingSystem,
    rowSpacingM: b.rowSpacingM,
    vineSpacingM: b.vineSpacingM,
    rowCount: b.rowCount,
    vinesPerRow: b.vinesPerRow,
    vinesPerPanel: b.vinesPerPanel,
    firstRow: b.firstRow,
    rowOrder: b.rowOrder,
    positionOrigin: b.positionOrigin,
    rowBearingDeg: b.rowBearingDeg,
    notes: b.notes,
  };
}

// Empty number inputs: null for optional fields, NaN (the schema's "enter …" message) for required ones.
const optionalNumber = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v)) };
const requiredNumber = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? NaN : Number(v)) };

/** Create or edit a block. The same zod schema checks the fields here and again on the server. */
export function BlockForm({ units, block }: { units: UnitSystem; block?: BlockView }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const hydrated = useHydrated();
  const [message, setMessage] = useState<string>();
  const form = useForm<BlockFormValues, unknown, BlockInput>({
    resolver: zodResolver(blockSchema),
    defaultValues: block ? valuesOf(block) : NEW_BLOCK,
    mode: 'onTouched',
  });
  const { errors } = form.formState;
  const save = useMutation({
    mutationFn: (input: BlockInput) => (block ? apiSend<BlockOne>('PATCH', `/api/blocks/${block.id}`, input) : apiSend<BlockOne>('POST', '/api/blocks', input)),
    onSuccess: async ({ block: saved }) => {
      await queryClient.invalidateQueries({ queryKey: ['blocks'] });
      await queryClient.invalidateQueries({ queryKey: ['block', saved.id] });
      router.push(`/blocks/${saved.id}`);
      router.refresh();
    },
    onError: (err) => {
      setMessage(err.message);
      if (err instanceof ApiError && err.fields) {
        for (const [name, messages] of Object.entries(err.fields)) {
          if (name in blockSchema.shape) form.setError(name as FieldPath<BlockFormValues>, { message: messages[0] });
        }
      }
    },
  });
  const onSubmit = form.handleSubmit(
    (input) => {
      setMessage(undefined);
      save.mutate(input);
    },
    () => setMessage('Some fields need attention; see the messages next to them.'),
  );

  const [rowCount, vinesPerRow, rowSpacingM, vineSpacingM] = form.watch(['rowCount', 'vinesPerRow', 'rowSpacingM', 'vineSpacingM']);
  const slots = Number(rowCount) * Number(vinesPerRow);
  const spacingsOk = Number(rowSpacingM) > 0 && Number(vineSpacingM) > 0;
  const err = (name: FieldPath<BlockFormValues>) => (errors[name as keyof typeof errors]?.message as string | undefined) ?? undefined;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6" aria-describedby={message ? 'block-form-message' : undefined}>
      <fieldset className="grid gap-4 sm:grid-cols-2" disabled={!hydrated}>
        <legend className="mb-2 text-xl font-bold">The block</legend>
        <Field id="name" label="Name" error={err('name')}>
          <Input id="name" autoComplete="off" {...form.register('name')} />
        </Field>
        <Field id="variety" label="Variety" error={err('variety')}>
          <Input id="variety" autoComplete="off" {...form.register('variety')} />
        </Field>
        <Field id="clone" label="Clone (optional)" error={err('clone')}>
          <Input id="clone" autoComplete="off" {...form.register('clone')} />
        </Field>
        <Field id="rootstock" label="Rootstock (optional)" error={err('rootstock')}>
          <Input id="rootstock" autoComplete="off" {...form.register('rootstock')} />
        </Field>
        <Field id="plantingYear" label="Planting year (optional)" error={err('plantingYear')}>
          <Input id="plantingYear" type="number" inputMode="numeric" {...form.register('plantingYear', optionalNumber)} />
        </Field>
        <div className="flex flex-col gap-1">
          <span className="font-bold" id="training-label">
            Pruned to
          </span>
          <div role="radiogroup" aria-labelledby="training-label" className="grid grid-cols-3 gap-2">
            {TRAINING_SYSTEMS.map((t) => (
              <label
                key={t}
                className={cn(
                  'flex min-h-touch cursor-pointer items-center justify-center rounded-lg border-2 px-2 text-center font-bold',
                  form.watch('trainingSystem') === t ? 'border-rootstock bg-rootstock-tint' : 'border-line bg-panel',
                )}
              >
                <input type="radio" value={t} className="sr-only" {...form.register('trainingSystem')} />
                {TRAINING_CHOICES[t]}
              </label>
            ))}
          </div>
          {err('trainingSystem') && <p className="text-sm font-bold text-alarm">{err('trainingSystem')}</p>}
        </div>
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2" disabled={!hydrated}>
        <legend className="mb-2 text-xl font-bold">Rows and vines</legend>
        <Field id="rowSpacingM" label="Row spacing" error={err('rowSpacingM')}>
          <Controller
            control={form.control}
            name="rowSpacingM"
            render={({ field, fieldState }) => (
              <LengthInput id="rowSpacingM" units={units} value={field.value} onChange={field.onChange} onBlur={field.onBlur} invalid={fieldState.invalid} />
            )}
          />
        </Field>
        <Field id="vineSpacingM" label="Vine spacing in the row" error={err('vineSpacingM')}>
          <Controller
            control={form.control}
            name="vineSpacingM"
            render={({ field, fieldState }) => (
              <LengthInput id="vineSpacingM" units={units} value={field.value} onChange={field.onChange} onBlur={field.onBlur} invalid={fieldState.invalid} />
            )}
          />
        </Field>
        <Field id="rowCount" label="Number of rows" error={err('rowCount')}>
          <Input id="rowCount" type="number" inputMode="numeric" min={1} {...form.register('rowCount', requiredNumber)} />
        </Field>
        <Field
          id="vinesPerRow"
          label="Vines per row"
          error={err('vinesPerRow')}
          hint="The usual row length. Shorter or longer rows are set per row on the block page or by CSV import."
        >
          <Input id="vinesPerRow" type="number" inputMode="numeric" min={1} {...form.register('vinesPerRow', requiredNumber)} />
        </Field>
        <Field
          id="vinesPerPanel"
          label="Vines per panel (optional)"
          error={err('vinesPerPanel')}
          hint="Vines between two line posts, so an address also reads “row 14, post 6, vine 3”."
        >
          <Input id="vinesPerPanel" type="number" inputMode="numeric" min={1} {...form.register('vinesPerPanel', optionalNumber)} />
        </Field>
        <Field id="firstRow" label="Number of the first row" error={err('firstRow')}>
          <Input id="firstRow" type="number" inputMode="numeric" min={1} {...form.register('firstRow', requiredNumber)} />
        </Field>
        <Field id="rowOrder" label="Row numbers on the grid" error={err('rowOrder')}>
          <Select id="rowOrder" {...form.register('rowOrder')}>
            <option value="ascending">First row at the top</option>
            <option value="descending">First row at the bottom</option>
          </Select>
        </Field>
        <Field
          id="positionOrigin"
          label="Where vine 1 stands (optional)"
          error={err('positionOrigin')}
          hint="The agreed row end every count starts from, e.g. “Vine 1 at the track end”."
        >
          <Input id="positionOrigin" autoComplete="off" {...form.register('positionOrigin')} />
        </Field>
        <Field
          id="rowBearingDeg"
          label="Row bearing in degrees (optional)"
          error={err('rowBearingDeg')}
          hint="0 for rows running north–south, 90 for east–west."
        >
          <Input id="rowBearingDeg" type="number" inputMode="numeric" min={0} max={359} {...form.register('rowBearingDeg', optionalNumber)} />
        </Field>
      </fieldset>

      <Field id="notes" label="Notes (optional)" error={err('notes')}>
        <textarea
          id="notes"
          rows={3}
          disabled={!hydrated}
          className="rounded-lg border-2 border-line bg-panel p-3 text-base focus:border-rootstock"
          {...form.register('notes')}
        />
      </Field>

      {Number.isFinite(slots) && slots > 0 && (
        <p className="rounded-lg bg-rootstock-tint p-3" data-testid="block-form-figures">
          {block ? 'About ' : ''}
          {formatCount(slots)} planting slots
          {spacingsOk && (
            <>
              {' '}
              on {formatAreaM2(slots * Number(rowSpacingM) * Number(vineSpacingM), units)},{' '}
              {formatVinesPerArea(Number(rowSpacingM), Number(vineSpacingM), units)}
            </>
          )}
          .
        </p>
      )}

      {message && (
        <div id="block-form-message" aria-live="assertive">
          <Notice tone="error">{message}</Notice>
        </div>
      )}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" size="large" disabled={!hydrated || save.isPending}>
          {save.isPending ? 'Saving…' : block ? 'Save changes' : 'Create block'}
        </Button>
        <ButtonLink href={block ? `/blocks/${block.id}` : '/blocks'} variant="secondary" size="large">
          Cancel
        </ButtonLink>
      </div>
    </form>
  );
}
