'use client';

import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, Select } from '@/components/ui/field';
import { detectionSampleSize, sampleSizeForMean, sampleSizeForProportion } from '@/lib/viticulture';
import { apiSend, ApiError } from '@/lib/api-client';
import type { SamplingPlanCreated } from '@/lib/contracts/plans';

interface BlockOption {
  id: string;
  name: string;
  vineCount: number;
  /** The spread of the block's weighed vines (last season's, else this season's), else its setting. */
  yieldCvPercent: number;
  /** Where that spread comes from, in words. */
  yieldCvFrom: string;
  sampleMarginPercent: number;
}

interface Values {
  blockId: string;
  name: string;
  count: number;
  avoidRowEnds: number;
}

/** Draws a sampling plan; suggests sizes from the two usual questions a scout's sample answers. */
export function PlanForm({ blocks }: { blocks: BlockOption[] }) {
  const router = useRouter();
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const form = useForm<Values>({ defaultValues: { blockId: blocks[0]?.id, name: '', count: 20, avoidRowEnds: 2 } });
  const block = blocks.find((b) => b.id === form.watch('blockId'));
  const estimate = block ? sampleSizeForProportion(block.vineCount) : undefined;
  const detect = detectionSampleSize(0.05);
  // A mean yield a vine needs the vines' spread, not a proportion (Wolpert & Vilas, AJEV 1992).
  const forYield = block ? sampleSizeForMean(block.yieldCvPercent, block.sampleMarginPercent, 0.95, block.vineCount) : undefined;
  const save = useMutation({
    mutationFn: async (values: Values) => {
      try {
        const body = await apiSend<SamplingPlanCreated>(
          'POST',
          '/api/sampling-plans',
          { ...values, count: Number(values.count), avoidRowEnds: Number(values.avoidRowEnds) },
          { fallback: 'The plan was not made.' },
        );
        return body.plan;
      } catch (err) {
        setFields(err instanceof ApiError ? (err.fields ?? {}) : {});
        throw err;
      }
    },
    onSuccess: () => {
      setFields({});
      router.refresh();
    },
  });
  return (
    <form onSubmit={form.handleSubmit((v) => save.mutate(v))} noValidate className="grid gap-3 sm:grid-cols-2">
      <Field id="plan-block" label="Block" error={fields.blockId?.[0]}>
        <Select id="plan-block" {...form.register('blockId')}>
          {blocks.map((b) => (
            <option key={b.id} value={b.id}>
              {b.name} ({b.vineCount.toLocaleString('en')} vines)
            </option>
          ))}
        </Select>
      </Field>
      <Field id="plan-name" label="Name" error={fields.name?.[0]}>
        <Input id="plan-name" placeholder="e.g. Budbreak check, October" {...form.register('name')} />
      </Field>
      <Field
        id="plan-count"
        label="Vines to visit"
        error={fields.count?.[0]}
        hint={
          <>
            {estimate !== undefined && (
              <button type="button" className="underline" onClick={() => form.setValue('count', estimate)}>
                {estimate} to estimate a share within ±5% (95% confidence)
              </button>
            )}
            {forYield !== undefined && (
              <>
                {' · '}
                <button type="button" className="underline" onClick={() => form.setValue('count', forYield)}>
                  {forYield} to estimate the mean yield a vine within ±{block?.sampleMarginPercent}% (vine yields varying by {block?.yieldCvPercent}%)
                </button>{' '}
                <span className="text-sm text-bark-soft">(spread from {block?.yieldCvFrom})</span>
              </>
            )}
            {' · '}
            <button type="button" className="underline" onClick={() => form.setValue('count', detect)}>
              {detect} to find a problem on 5% of vines (95% confidence)
            </button>
            {' · 20 for a quick look (5 per quarter)'}
          </>
        }
      >
        <Input id="plan-count" type="number" inputMode="numeric" {...form.register('count', { valueAsNumber: true })} />
      </Field>
      <Field id="plan-ends" label="Skip this many vines at each row end" error={fields.avoidRowEnds?.[0]}>
        <Input id="plan-ends" type="number" inputMode="numeric" {...form.register('avoidRowEnds', { valueAsNumber: true })} />
      </Field>
      <div className="sm:col-span-2">
        <Button type="submit" disabled={save.isPending}>
          Draw the plan
        </Button>
      </div>
      {save.isError && (
        <Notice tone="error" className="sm:col-span-2">
          {save.error.message}
        </Notice>
      )}
      {save.isSuccess && (
        <Notice tone="ok" className="sm:col-span-2">
          Plan drawn: {save.data.count} vines. Scouts find it on the block&apos;s field page.
        </Notice>
      )}
    </form>
  );
}
