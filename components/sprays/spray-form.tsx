'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, Select } from '@/components/ui/field';
import { spraySchema } from '@/lib/validation/spray';
import { apiSend, ApiError } from '@/lib/api-client';

// The form edits local date-time text; the request carries ISO times with the device's offset.
const formSchema = spraySchema.extend({ appliedAt: z.string().min(1, 'When did the application end?') });
type FormValues = z.input<typeof formSchema>;

export function SprayForm({ blocks }: { blocks: { id: string; name: string }[] }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [serverErrors, setServerErrors] = useState<Record<string, string[]>>({});
  const form = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { blockId: blocks[0]?.id } });
  const save = useMutation({
    mutationFn: async (values: FormValues) => {
      try {
        return await apiSend(
          'POST',
          '/api/sprays',
          { ...values, appliedAt: new Date(values.appliedAt).toISOString() },
          { fallback: 'The spray was not recorded.' },
        );
      } catch (err) {
        setServerErrors(err instanceof ApiError ? (err.fields ?? {}) : {});
        throw err;
      }
    },
    onSuccess: () => {
      form.reset({ blockId: form.getValues('blockId') });
      setServerErrors({});
      void queryClient.invalidateQueries({ queryKey: ['sprays'] });
      router.refresh();
    },
  });
  const error = (name: keyof FormValues) => form.formState.errors[name]?.message ?? serverErrors[name]?.[0];
  return (
    <form onSubmit={form.handleSubmit((v) => save.mutate(v))} noValidate className="grid gap-3 sm:grid-cols-2">
      <Field id="spray-block" label="Block" error={error('blockId')}>
        <Select id="spray-block" {...form.register('blockId')}>
          {blocks.map((b) => (
            <option key={b.id} value={b.id}>
              {b.name}
            </option>
          ))}
        </Select>
      </Field>
      <Field id="spray-product" label="Product (as on the label)" error={error('product')}>
        <Input id="spray-product" {...form.register('product')} />
      </Field>
      <Field id="spray-applied" label="Application ended at" error={error('appliedAt')}>
        <Input id="spray-applied" type="datetime-local" {...form.register('appliedAt')} />
      </Field>
      <Field id="spray-rei" label="Restricted-entry interval (hours, from the label)" error={error('reiHours')}>
        <Input id="spray-rei" type="number" inputMode="decimal" step="any" {...form.register('reiHours', { valueAsNumber: true })} />
      </Field>
      <Field id="spray-notes" label="Notes (optional)" error={error('notes')}>
        <Input id="spray-notes" {...form.register('notes')} />
      </Field>
      <div className="flex items-end">
        <Button type="submit" disabled={save.isPending}>
          Record spray
        </Button>
      </div>
      {save.isError && (
        <Notice tone="error" className="sm:col-span-2">
          {save.error.message}
        </Notice>
      )}
      {save.isSuccess && (
        <Notice tone="ok" className="sm:col-span-2">
          Spray recorded. Scouts opening that block see the re-entry warning until the interval ends.
        </Notice>
      )}
    </form>
  );
}
