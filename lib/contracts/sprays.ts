/** Sprays: what /api/sprays answers. The request schema is in lib/validation/spray.ts. */

export interface SprayView<T = string> {
  id: string;
  blockId: string;
  blockName: string;
  product: string;
  appliedAt: T;
  reiHours: number;
  /** When the restricted-entry interval on the label ends: appliedAt + reiHours. */
  reentryAt: T;
  notes: string | null;
}

export interface SprayList {
  sprays: SprayView[];
}

export interface SprayCreated {
  id: string;
}
