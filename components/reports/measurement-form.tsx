'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { useForm, type FieldPath, type Resolver } from 'react-hook-form';
import { apiGet, apiSend, ApiError } from '@/lib/api-client';
import type { MeasurementList, MeasurementOne } from '@/lib/contracts/reports';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import { vineAddress } from '@/lib/grid/labels';
import { formatWeightKg } from '@/lib/reports/format';
import { seasonOf, type SeasonBounds } from '@/lib/reports/season';
import type { UnitSystem } from '@/lib/units';
import { MEASUREMENT_LABELS, measurementSchema, type MeasurementFormValues, type MeasurementInput } from '@/lib/validation/measurement';

interface MeasurementsProps {
  block: { id: string; name: string; vinesPerPanel: number | null };
  season: number;
  /** The season's first instant and the next season's (lib/reports/season.ts). */
  period: SeasonBounds;
  units: UnitSystem;
  canRecord: boolean;
  canRemoveAny: boolean;
  userId: string;
}

const optionalNumber = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v)) };
const requiredNumber = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? NaN : Number(v)) };

const choice = (on: boolean) =>
  cn(
    'flex min-h-touch cursor-pointer items-center justify-center rounded-lg border-2 px-3 text-center font-bold has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-cut',
    on ? 'border-rootstock bg-rootstock text-white' : 'border-line bg-panel',
  );

/** Yield and pruning-weight entry for one block and season, with what was entered so far. */
export function Measurements({ block, season, period, units, canRecord, canRemoveAny, userId }: MeasurementsProps) {
  const queryClient = useQueryClient();
  const key = ['measurements', block.id, season];
  const list = useQuery({
    queryKey: key,
    queryFn: () => apiGet<MeasurementList>(`/api/measurements?blockId=${block.id}&season=${season}`),
  });
  const remove = useMutation({
    mutationFn: (id: string) => apiSend('DELETE', `/api/measurements/${id}`, undefined, { fallback: 'Could not remove it; try again.' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: key }),
  });
  return (
    <div className="flex flex-col gap-6">
      {canRecord ? (
        <MeasurementForm block={block} period={period} units={units} onSaved={() => queryClient.invalidateQueries({ queryKey: key })} />
      ) : (
        <Notice>Advisors read these weights; a manager, scout or pruner enters them.</Notice>
      )}
      <section aria-labelledby="entered" className="flex flex-col gap-2">
        <h2 id="entered" className="text-2xl font-extrabold">
          Entered for {season}
        </h2>
        {remove.error && <Notice tone="error">{remove.error.message}</Notice>}
        {list.isPending ? (
          <p>Loading…</p>
        ) : list.error ? (
          <Notice tone="error">{list.error.message}</Notice>
        ) : list.data.measurements.length === 0 ? (
          <p>Nothing entered for {season} yet.</p>
        ) : (
          <ul className="flex flex-col gap-2" data-testid="measurement-list">
            {list.data.measurements.map((m) => (
              <li key={m.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 rounded-xl border-2 border-line bg-panel p-3">
                <span className="font-bold">{m.kind === 'yield' ? 'Yield' : 'Prunings'}</span>
                <span>{m.position === null ? `Row ${m.row}, sample of ${m.vines} vines` : vineAddress(m.row, m.position, block.vinesPerPanel)}</span>
                <span>
                  {formatWeightKg(m.weightKg, units, 2)}
                  {m.vines > 1 ? ` (${formatWeightKg(m.weightKg / m.vines, units, 2)} a vine)` : ''}
                  {m.clusters !== null ? `, ${m.clusters} clusters` : ''}
                </span>
                <span className="text-bark-soft">
                  {m.measuredOn}
                  {m.recordedByName ? ` · ${m.recordedByName}` : ''}
                  {m.note ? ` · ${m.note}` : ''}
                </span>
                {(canRemoveAny || (canRecord && m.recordedBy === userId)) && (
                  <Button type="button" variant="quiet" className="ml-auto" disabled={remove.isPending} onClick={() => remove.mutate(m.id)}>
                    Remove
                  </Button>
                )}
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}

/**
 * The shared schema, after the form's choices are applied: a row sample has no vine number, a single
 * vine is one vine, and only a yield counts clusters. What a hidden box still holds never blocks saving.
 */
function scoped(sample: { current: boolean }): Resolver<MeasurementFormValues, unknown, MeasurementInput> {
  const resolve = zodResolver(measurementSchema);
  return (values, context, options) =>
    resolve(
      {
        ...values,
        position: sample.current ? null : values.position,
        vines: sample.current ? values.vines : 1,
        clusters: values.kind === 'yield' ? values.clusters : null,
      },
      context,
      options,
    );
}

/**
 * The day a new weight defaults to: today within the season, else about harvest time, eight and a
 * half months after the season starts (15 September for a January start, 15 March for a July one).
 */
function defaultDay({ from, to }: SeasonBounds, today: string) {
  if (today >= from.slice(0, 10) && today < to.slice(0, 10)) return today;
  const harvest = new Date(from);
  harvest.setUTCMonth(harvest.getUTCMonth() + 8, 15);
  return harvest.toISOString().slice(0, 10);
}

function MeasurementForm({
  block,
  period,
  units,
  onSaved,
}: {
  block: MeasurementsProps['block'];
  period: SeasonBounds;
  units: UnitSystem;
  onSaved: () => void;
}) {
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string }>();
  const [sample, setSampleState] = useState(false);
  // Read by the resolver, which the form keeps from its first render.
  const sampleRef = useRef(false);
  const setSample = (on: boolean) => {
    sampleRef.current = on;
    setSampleState(on);
  };
  const today = new Date().toISOString().slice(0, 10);
  const form = useForm<MeasurementFormValues, unknown, MeasurementInput>({
    resolver: scoped(sampleRef),
    defaultValues: {
      blockId: block.id,
      kind: 'yield',
      weightUnit: units === 'metric' ? 'kg' : 'lb',
      vines: 1,
      position: null,
      clusters: null,
      measuredOn: defaultDay(period, today),
      note: '',
    },
    mode: 'onTouched',
  });
  const { errors } = form.formState;
  const kind = form.watch('kind');
  const save = useMutation({
    mutationFn: (input: MeasurementInput) => apiSend<MeasurementOne>('POST', '/api/measurements', input),
    onSuccess: ({ measurement }) => {
      const day = measurement.measuredOn.slice(0, 10);
      const inSeason = day >= period.from.slice(0, 10) && day < period.to.slice(0, 10);
      const other = inSeason ? '' : ` It belongs to the ${seasonOf(`${day}T00:00:00Z`, Number(period.from.slice(5, 7)))} season.`;
      setMessage({
        tone: 'ok',
        text: `Saved: ${measurement.position === null ? `row ${measurement.row} sample` : vineAddress(measurement.row, measurement.position, block.vinesPerPanel)}, ${formatWeightKg(measurement.weightKg, units, 2)}.${other}`,
      });
      // Ready for the next vine: same kind, unit, day and row; the vine and weight cleared.
      form.reset({ ...form.getValues(), position: null, weight: undefined, clusters: null, note: '' }, { keepDefaultValues: true });
      onSaved();
    },
    onError: (err) => {
      setMessage({ tone: 'error', text: err.message });
      if (err instanceof ApiError && err.fields) {
        for (const [name, messages] of Object.entries(err.fields)) form.setError(name as FieldPath<MeasurementFormValues>, { message: messages[0] });
      }
    },
  });
  const onSubmit = form.handleSubmit(
    (input) => {
      setMessage(undefined);
      save.mutate(input);
    },
    (invalid) => {
      // Fields not on screen (a vine number behind "Row sample") still say what is wrong.
      const shown = new Set(['row', 'weight', 'measuredOn', 'note', sample ? 'vines' : 'position', ...(kind === 'yield' ? ['clusters'] : [])]);
      const hidden = Object.entries(invalid)
        .filter(([name]) => !shown.has(name))
        .map(([, e]) => e?.message)
        .filter(Boolean);
      setMessage({ tone: 'error', text: ['Some fields need attention; see the messages next to them.', ...hidden].join(' ') });
    },
  );
  const err = (name: FieldPath<MeasurementFormValues>) => errors[name as keyof typeof errors]?.message as string | undefined;
  const weightWord = units === 'metric' ? 'kg' : 'lb';

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-xl border-2 border-line bg-panel p-4" aria-label="Enter a weight">
      <h2 className="text-2xl font-extrabold">Enter a weight</h2>
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 font-bold">What was weighed</legend>
        <div className="grid grid-cols-2 gap-2">
          {(['yield', 'pruning-weight'] as const).map((k) => (
            <label key={k} className={choice(kind === k)}>
              <input type="radio" value={k} className="sr-only" {...form.register('kind')} />
              {k === 'yield' ? 'Yield' : 'Pruning weight'}
            </label>
          ))}
        </div>
        <p className="text-sm text-bark-faint">{MEASUREMENT_LABELS[kind]}</p>
      </fieldset>
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 font-bold">Weighed as</legend>
        <div className="grid grid-cols-2 gap-2">
          <label className={choice(!sample)}>
            <input
              type="radio"
              name="scope"
              className="sr-only"
              checked={!sample}
              onChange={() => {
                setSample(false);
                form.setValue('vines', 1);
              }}
            />
            One vine
          </label>
          <label className={choice(sample)}>
            <input
              type="radio"
              name="scope"
              className="sr-only"
              checked={sample}
              onChange={() => {
                setSample(true);
                form.setValue('position', null);
              }}
            />
            Row sample
          </label>
        </div>
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id="m-row" label="Row" error={err('row')}>
          <Input id="m-row" type="number" inputMode="numeric" {...form.register('row', requiredNumber)} />
        </Field>
        {sample ? (
          <Field id="m-vines" label="Vines in the sample" error={err('vines')}>
            <Input id="m-vines" type="number" inputMode="numeric" {...form.register('vines', requiredNumber)} />
          </Field>
        ) : (
          <Field id="m-position" label="Vine" error={err('position')} hint="The planting slot, counted from the row's numbered end">
            <Input id="m-position" type="number" inputMode="numeric" {...form.register('position', requiredNumber)} />
          </Field>
        )}
        <Field id="m-weight" label={`Weight (${weightWord})`} error={err('weight')} hint={sample ? 'All the vines of the sample together' : undefined}>
          <Input id="m-weight" type="number" inputMode="decimal" step="any" {...form.register('weight', requiredNumber)} />
        </Field>
        {kind === 'yield' && (
          <Field id="m-clusters" label="Clusters (optional)" error={err('clusters')} hint="Counting them gives the block's cluster weight">
            <Input id="m-clusters" type="number" inputMode="numeric" {...form.register('clusters', optionalNumber)} />
          </Field>
        )}
        <Field id="m-day" label="Day weighed" error={err('measuredOn')}>
          <Input id="m-day" type="date" max={today} {...form.register('measuredOn')} />
        </Field>
        <Field id="m-note" label="Note (optional)" error={err('note')}>
          <Input id="m-note" autoComplete="off" {...form.register('note')} />
        </Field>
      </div>
      <input type="hidden" {...form.register('weightUnit')} />
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save weight'}
        </Button>
        {message && (
          <Notice tone={message.tone} className="flex-1">
            {message.text}
          </Notice>
        )}
      </div>
    </form>
  );
}
