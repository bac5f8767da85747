// The observation kinds a scout records and the fields of each, in camelCase with units in the
// names. The server's zod schemas mirror these; the enumerations are exported as arrays so a schema
// can be built from them (z.enum(EXPOSURES)) rather than retyped.

export const OBSERVATION_KINDS = [
  'cane-diameter',
  'shade-cane',
  'weak-budbreak',
  'trunk-injury',
  'cane-injury',
  'missing-vine',
  'bud-injury',
  'pruning-record',
  'pruning-check',
  'note',
] as const;
export type ObservationKind = (typeof OBSERVATION_KINDS)[number];

export const EXPOSURES = ['sun', 'partial', 'shade'] as const;
export type Exposure = (typeof EXPOSURES)[number];

export const WOOD_ORIGINS = ['two-year-wood', 'older-wood', 'trunk'] as const;
export type WoodOrigin = (typeof WOOD_ORIGINS)[number];

export const INJURY_SEVERITIES = ['light', 'moderate', 'severe'] as const;
export type InjurySeverity = (typeof INJURY_SEVERITIES)[number];

export const TRUNK_INJURY_CAUSES = ['cold', 'mechanical', 'disease', 'wire-girdling', 'rodent', 'unknown'] as const;
export type TrunkInjuryCause = (typeof TRUNK_INJURY_CAUSES)[number];

export const CANE_INJURY_CAUSES = ['cold', 'mechanical', 'disease', 'hail', 'pest', 'unknown'] as const;
export type CaneInjuryCause = (typeof CANE_INJURY_CAUSES)[number];

export const VINE_STATES = ['missing', 'dead', 'dying'] as const;
export type VineState = (typeof VINE_STATES)[number];

export interface CaneDiameterData {
  diameterMm: number;
  longestInternodeMm?: number;
  exposure?: Exposure;
  colourGood?: boolean;
  flat?: boolean;
  origin?: WoodOrigin;
  injured?: boolean;
}

export interface ShadeCaneData {
  longestInternodeMm: number;
  exposure: Exposure;
  colourGood: boolean;
  diameterMm?: number;
}

export interface WeakBudbreakData {
  budsRetained: number;
  budsPushed: number;
}

export interface TrunkInjuryData {
  cause: TrunkInjuryCause;
  severity: InjurySeverity;
  /** Share of the trunk's circumference girdled, 0–100. */
  girdlingPercent: number;
}

export interface CaneInjuryData {
  cause: CaneInjuryCause;
  canesAffected: number;
  severity: InjurySeverity;
}

export interface MissingVineData {
  state: VineState;
}

export interface BudInjuryData {
  budsCut: number;
  primariesDead: number;
}

export interface PruningRecordData {
  canesKept: number;
  budsPerCane: number;
  renewalSpurs: number;
  pruningWeightKg?: number;
  budTarget?: number;
}

/** A crew lead's check of what a pruner left on one vine. */
export interface PruningCheckData {
  /** The person whose pruning is checked. */
  prunedBy: string;
  /** Fruiting canes left (spurs, on a spur-pruned vine). */
  canesKept: number;
  /** Buds left on those canes or spurs, all together. */
  budsOnCanes: number;
  renewalSpurs: number;
  /** The block's bud target per vine, as the crew was told it. */
  budTarget?: number;
}

export type NoteData = Record<string, never>;

export interface ObservationDataMap {
  'cane-diameter': CaneDiameterData;
  'shade-cane': ShadeCaneData;
  'weak-budbreak': WeakBudbreakData;
  'trunk-injury': TrunkInjuryData;
  'cane-injury': CaneInjuryData;
  'missing-vine': MissingVineData;
  'bud-injury': BudInjuryData;
  'pruning-record': PruningRecordData;
  'pruning-check': PruningCheckData;
  note: NoteData;
}

export type ObservationData<K extends ObservationKind = ObservationKind> = ObservationDataMap[K];

/** A kind with its matching data: switching on `kind` narrows `data`. */
export type Observation = { [K in ObservationKind]: { kind: K; data: ObservationDataMap[K] } }[ObservationKind];

export function isObservationKind(value: unknown): value is ObservationKind {
  return typeof value === 'string' && (OBSERVATION_KINDS as readonly string[]).includes(value);
}
