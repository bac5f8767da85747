/**
 * Words for the observation kinds and severities, shared by the grid, the reports and the desk.
 * Pure: no UI, so lib/reports and lib/grid both read it without reaching into each other.
 */
import type { ObservationKind, Severity } from '@/lib/viticulture';

const KIND_LABELS: Record<ObservationKind, string> = {
  'cane-diameter': 'Cane diameter',
  'shade-cane': 'Shade cane',
  'weak-budbreak': 'Weak budbreak',
  'trunk-injury': 'Trunk injury',
  'cane-injury': 'Cane injury',
  'missing-vine': 'Missing or dead vine',
  'bud-injury': 'Winter bud injury',
  'pruning-record': 'Pruning record',
  'pruning-check': 'Pruning check',
  note: 'Note',
};

/** A kind's name; a kind added later reads from its code until it gets one. */
export const kindLabel = (kind: string) => KIND_LABELS[kind as ObservationKind] ?? kind.charAt(0).toUpperCase() + kind.slice(1).replace(/-/g, ' ');

/**
 * Kinds that record work done or a remark, not a problem found on the vine. Their severity says how
 * far a pruner was off the bud target, so they never count towards the incidence of problems.
 */
export const RECORD_KINDS: readonly ObservationKind[] = ['pruning-record', 'pruning-check', 'note'];

/** A finding: something a scout found wrong (or checked and found fine) on a vine. */
export const isFindingKind = (kind: string) => !(RECORD_KINDS as readonly string[]).includes(kind);

export const SEVERITY_LABELS: Record<Severity, string> = {
  0: 'Fine',
  1: 'Watch',
  2: 'Act this season',
  3: 'Act now',
};
