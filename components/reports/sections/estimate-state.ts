'use client';

import { usePathname, useSearchParams } from 'next/navigation';
import { useMemo, useState } from 'react';
import { adjustForBudInjury, type BlockReport } from '@/lib/reports/block-report';
import { cropEstimate, cropRestsOn, labourEstimate, type InputValue } from '@/lib/reports/estimates';
import { reportOptionsSchema } from '@/lib/validation/report';
import { DEFAULT_SETTINGS } from '@/lib/viticulture';

export type InputKey =
  | 'budsPerVine'
  | 'budbreakPercent'
  | 'clustersPerShoot'
  | 'clusterWeightG'
  | 'clustersPerVine'
  | 'lagClusterWeightG'
  | 'minutesPerVine'
  | 'hourlyCost'
  | 'budTarget';

const NO_INPUT: InputValue = { value: null, source: '', defaultValue: null, defaultSource: '' };

function initialText(input: InputValue) {
  return input.source === 'entered' && input.value !== null ? String(input.value) : input.defaultValue === null ? '' : String(input.defaultValue);
}

export interface ReadInput {
  value: number | null;
  error?: string;
  entered: boolean;
}

/** Reads one input: empty means the default; anything else must pass the report schema. */
function readInput(key: InputKey, text: string, input: InputValue): ReadInput {
  if (text.trim() === '') return { value: input.defaultValue, entered: false };
  const parsed = reportOptionsSchema.shape[key].safeParse(text.trim());
  if (!parsed.success || parsed.data === undefined)
    return { value: null, error: parsed.success ? 'Enter a number' : parsed.error.issues[0]!.message, entered: true };
  return { value: parsed.data as number, entered: Number(parsed.data) !== input.defaultValue };
}

/**
 * The estimate inputs a manager edits on the page: what is typed, what it reads as, and the crop,
 * labour and bud target recomputed from them in the browser, with exactly the server's functions.
 */
export function useEstimateInputs(report: BlockReport) {
  const pathname = usePathname();
  const search = useSearchParams();
  const inputs: Record<InputKey, InputValue> = useMemo(
    () => ({
      ...report.crop.inputs,
      clustersPerVine: report.crop.inputs.clustersPerVine ?? NO_INPUT,
      lagClusterWeightG: report.crop.inputs.lagClusterWeightG ?? NO_INPUT,
      ...report.labour.inputs,
      budTarget: report.budInjury?.target ?? NO_INPUT,
    }),
    [report],
  );
  const [texts, setTexts] = useState<Record<InputKey, string>>(
    () => Object.fromEntries(Object.entries(inputs).map(([k, v]) => [k, initialText(v)])) as Record<InputKey, string>,
  );
  const read = Object.fromEntries((Object.keys(inputs) as InputKey[]).map((k) => [k, readInput(k, texts[k], inputs[k])])) as Record<InputKey, ReadInput>;
  const used = (k: InputKey): InputValue => ({ ...inputs[k], value: read[k].value, source: read[k].entered ? 'entered' : inputs[k].defaultSource });

  const cropInputs = {
    budsPerVine: used('budsPerVine'),
    budbreakPercent: used('budbreakPercent'),
    clustersPerShoot: used('clustersPerShoot'),
    clusterWeightG: used('clusterWeightG'),
    clustersPerVine: used('clustersPerVine'),
    lagClusterWeightG: used('lagClusterWeightG'),
  };
  const crop = cropEstimate(report.crop.basis, cropInputs);
  const labour = labourEstimate(report.labour.basis, { minutesPerVine: used('minutesPerVine'), hourlyCost: used('hourlyCost') });
  const adjusted = report.budInjury
    ? adjustForBudInjury(read.budTarget.value, report.budInjury.kill.value!, { ...DEFAULT_SETTINGS, budInjury: report.budInjury.limits })
    : null;

  function change(key: InputKey, text: string) {
    setTexts({ ...texts, [key]: text });
    // Kept in the address without asking the server again, so printing, sharing and reloading keep the inputs.
    const params = new URLSearchParams(search.toString());
    const r = readInput(key, text, inputs[key]);
    if (r.entered && r.value !== null && !r.error) params.set(key, String(r.value));
    else if (!r.entered) params.delete(key);
    window.history.replaceState(null, '', `${pathname}?${params.toString()}`);
  }

  return { inputs, texts, read, used, change, cropInputs, crop, cropRestsOn: cropRestsOn(cropInputs), labour, adjusted };
}

export type EstimateState = ReturnType<typeof useEstimateInputs>;
