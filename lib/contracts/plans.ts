/** Sampling plans: what /api/sampling-plans answers. The request schema is in lib/validation/sampling-plan.ts. */
import type { VineAddress } from '@/lib/viticulture/sampling';

export interface SamplingPlanView<T = string> {
  id: string;
  blockId: string;
  name: string;
  seed: number;
  options: Record<string, unknown>;
  addresses: VineAddress[];
  createdAt: T;
}

export interface SamplingPlanList {
  plans: SamplingPlanView[];
}

export interface SamplingPlanCreated {
  plan: { id: string; name: string; seed: number; count: number; addresses: VineAddress[] };
}
