import type { ObservationKind } from '@/lib/viticulture';
import { BudInjuryFields, WeakBudbreakFields } from './buds';
import { CaneDiameterFields, ShadeCaneFields } from './cane';
import { CaneInjuryFields, MissingVineFields, NoteFields, TrunkInjuryFields } from './damage';
import type { FieldsComponent } from './parts';
import { PruningCheckFields, PruningRecordFields } from './pruning';

export type { FieldsComponent, FieldsProps } from './parts';

/** Each kind's own fields; a new kind in OBSERVATION_KINDS does not compile until it has an entry here. */
export const KIND_FIELDS: Record<ObservationKind, FieldsComponent> = {
  'cane-diameter': CaneDiameterFields,
  'shade-cane': ShadeCaneFields,
  'weak-budbreak': WeakBudbreakFields,
  'trunk-injury': TrunkInjuryFields,
  'cane-injury': CaneInjuryFields,
  'missing-vine': MissingVineFields,
  'bud-injury': BudInjuryFields,
  'pruning-record': PruningRecordFields,
  'pruning-check': PruningCheckFields,
  note: NoteFields,
};
