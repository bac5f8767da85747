import { describe, expect, it } from 'vitest';
import {
  OBSERVATION_KINDS,
  SEVERITIES,
  budDeviationPercent,
  isObservationKind,
  observationSeverity,
  pruningCheckBuds,
  type Observation,
} from '@/lib/viticulture';

// Limits are literals: sourced ones name their source, the product's own scale says "no source".

describe('observationSeverity', () => {
  it('has a rule for every observation kind, each answering 0–3', () => {
    const samples: Observation[] = [
      { kind: 'cane-diameter', data: { diameterMm: 9.5 } },
      { kind: 'shade-cane', data: { longestInternodeMm: 60, exposure: 'sun', colourGood: true } },
      { kind: 'weak-budbreak', data: { budsRetained: 28, budsPushed: 15 } },
      { kind: 'trunk-injury', data: { cause: 'cold', severity: 'light', girdlingPercent: 0 } },
      { kind: 'cane-injury', data: { cause: 'hail', canesAffected: 1, severity: 'light' } },
      { kind: 'missing-vine', data: { state: 'missing' } },
      { kind: 'bud-injury', data: { budsCut: 100, primariesDead: 12 } },
      { kind: 'pruning-record', data: { canesKept: 2, budsPerCane: 13, renewalSpurs: 2 } },
      { kind: 'pruning-check', data: { prunedBy: 'p', canesKept: 2, budsOnCanes: 26, renewalSpurs: 2, budTarget: 30 } },
      { kind: 'note', data: {} },
    ];
    expect(samples.map((o) => o.kind)).toEqual([...OBSERVATION_KINDS]);
    for (const o of samples) expect(SEVERITIES).toContain(observationSeverity(o.kind, o.data));
  });

  it('scores a cane by its assessCane verdict: fruit cane 0, second choice 1, remove 2', () => {
    expect(observationSeverity('cane-diameter', { diameterMm: 9.5 })).toBe(0);
    expect(observationSeverity('cane-diameter', { diameterMm: 7.5 })).toBe(1); // thin, under 5/16 in (Westover, Wines & Vines 2016)
    expect(observationSeverity('cane-diameter', { diameterMm: 14 })).toBe(2); // bull cane over 1/2 in: a poor selection (eXtension)
    expect(observationSeverity('cane-diameter', { diameterMm: 9.5, injured: true })).toBe(2);
    expect(observationSeverity('cane-diameter', { diameterMm: 9.5, flat: true, origin: 'older-wood' })).toBe(2);
  });

  it('scores a shade cane from the signs measured, with or without its diameter', () => {
    const limit = 152.4; // 6 in: eXtension's "very long internodes (5-6 inches or more)"
    expect(observationSeverity('shade-cane', { longestInternodeMm: limit, exposure: 'partial', colourGood: true })).toBe(0);
    expect(observationSeverity('shade-cane', { longestInternodeMm: limit + 40, exposure: 'shade', colourGood: true })).toBe(1);
    expect(observationSeverity('shade-cane', { longestInternodeMm: limit + 40, exposure: 'shade', colourGood: false })).toBe(2);
    expect(observationSeverity('shade-cane', { longestInternodeMm: 60, exposure: 'sun', colourGood: true, diameterMm: 5.5 })).toBe(1);
  });

  it('scores budbreak against the settings only (no published threshold exists)', () => {
    // 75 / 50 / 20%: common practice, no source.
    const [weakBelowPercent, poorBelowPercent, failedBelowPercent] = [75, 50, 20];
    const at = (percent: number) => observationSeverity('weak-budbreak', { budsRetained: 100, budsPushed: percent });
    expect(at(weakBelowPercent)).toBe(0);
    expect(at(weakBelowPercent - 1)).toBe(1);
    expect(at(poorBelowPercent - 1)).toBe(2);
    expect(at(failedBelowPercent - 1)).toBe(3);
    expect(observationSeverity('weak-budbreak', { budsRetained: 100, budsPushed: 85 }, { budbreak: { weakBelowPercent: 90 } })).toBe(1);
  });

  it('makes severe trunk injury or girdling past the urgent setting urgent, moderate injury or partial girdling 2, any other 1', () => {
    const trunk = (severity: 'light' | 'moderate' | 'severe', girdlingPercent: number) =>
      observationSeverity('trunk-injury', { cause: 'mechanical', severity, girdlingPercent });
    expect(trunk('light', 0)).toBe(1);
    // 25% and 50% of the circumference: common practice, no source.
    expect(trunk('light', 26)).toBe(2);
    expect(trunk('moderate', 0)).toBe(2);
    expect(trunk('light', 50)).toBe(2);
    expect(trunk('light', 51)).toBe(3);
    expect(trunk('severe', 0)).toBe(3);
  });

  it('scores cane injury by severity, urgent when severe on many canes, fine when no cane is affected', () => {
    const cane = (severity: 'light' | 'moderate' | 'severe', canesAffected: number) =>
      observationSeverity('cane-injury', { cause: 'hail', canesAffected, severity });
    expect(cane('severe', 0)).toBe(0);
    expect(cane('light', 5)).toBe(1);
    expect(cane('moderate', 1)).toBe(2);
    // Three canes: common practice, no source.
    expect(cane('severe', 2)).toBe(2);
    expect(cane('severe', 3)).toBe(3);
  });

  it('makes a missing or dead vine a replanting job (2) and a dying one urgent (3)', () => {
    expect(observationSeverity('missing-vine', { state: 'missing' })).toBe(2);
    expect(observationSeverity('missing-vine', { state: 'dead' })).toBe(2);
    expect(observationSeverity('missing-vine', { state: 'dying' })).toBe(3);
  });

  it('scores winter bud injury: under 20% 0 (Cornell NNY 2014), 20–50% 2, above 50% 3, minimal pruning (Purdue Facts for Fancy Fruit)', () => {
    expect(observationSeverity('bud-injury', { budsCut: 100, primariesDead: 19 })).toBe(0);
    expect(observationSeverity('bud-injury', { budsCut: 100, primariesDead: 20 })).toBe(2);
    expect(observationSeverity('bud-injury', { budsCut: 100, primariesDead: 50 })).toBe(2);
    expect(observationSeverity('bud-injury', { budsCut: 100, primariesDead: 51 })).toBe(3);
  });

  it("scores a pruning record by how far its buds stray from the target, in the settings' steps", () => {
    // 2 canes × 13 buds + 2 renewal spurs × 2 buds = 30 buds retained.
    const record = (budTarget: number) => observationSeverity('pruning-record', { canesKept: 2, budsPerCane: 13, renewalSpurs: 2, budTarget });
    expect(record(30)).toBe(0);
    expect(record(33)).toBe(0); // 9% off
    expect(record(36)).toBe(1); // 16.7% off
    expect(record(45)).toBe(2); // 33% off
    expect(record(70)).toBe(3); // 57% off
    expect(record(0)).toBe(3);
  });

  it('puts the pruning-record steps at 10, 25 and 50 % off target, each limit counted on the nearer side (common practice, no source)', () => {
    // One cane of n buds against a target of 100: n − 100 percent off.
    const off = (n: number) => observationSeverity('pruning-record', { canesKept: 1, budsPerCane: n, renewalSpurs: 0, budTarget: 100 });
    expect([off(110), off(111), off(90), off(89)]).toEqual([0, 1, 0, 1]);
    expect([off(125), off(126), off(75), off(74)]).toEqual([1, 2, 1, 2]);
    expect([off(150), off(151), off(50), off(49)]).toEqual([2, 3, 2, 3]);
  });

  it("derives the target from a pruning weight in kilograms with the settings' formula (vinifera 20 + 20 by default)", () => {
    // 0.6803886 kg is 1.5 lb: 30 buds under 20 + 20.
    expect(observationSeverity('pruning-record', { canesKept: 2, budsPerCane: 13, renewalSpurs: 2, pruningWeightKg: 0.6803886 })).toBe(0);
    expect(observationSeverity('pruning-record', { canesKept: 2, budsPerCane: 13, renewalSpurs: 2, pruningWeightKg: 0.8 })).toBe(1); // 1.76 lb → 35 buds, 14% off
  });

  it('has nothing to measure a pruning record without a target against, and scores an empty record against a zero target as fine', () => {
    expect(observationSeverity('pruning-record', { canesKept: 1, budsPerCane: 40, renewalSpurs: 0 })).toBe(0);
    expect(observationSeverity('pruning-record', { canesKept: 0, budsPerCane: 0, renewalSpurs: 0, budTarget: 0 })).toBe(0);
  });

  it("scores a pruning check by the buds the pruner left against the block's target, on the pruning-record steps", () => {
    // 26 buds on two canes + 2 renewal spurs × 2 buds = 30 buds left.
    const check = (budTarget?: number, budsOnCanes = 26) =>
      observationSeverity('pruning-check', { prunedBy: 'p', canesKept: 2, budsOnCanes, renewalSpurs: 2, ...(budTarget === undefined ? {} : { budTarget }) });
    expect(check(30)).toBe(0);
    expect(check(36)).toBe(1); // 16.7% too few
    expect(check(30, 36)).toBe(2); // 40 buds: 33% too many
    expect(check(70)).toBe(3);
    expect(check(0)).toBe(3);
    expect(check(undefined)).toBe(0);
    expect(observationSeverity('pruning-check', { prunedBy: 'p', canesKept: 0, budsOnCanes: 0, renewalSpurs: 0, budTarget: 0 })).toBe(0);
  });

  it("counts a checked vine's buds with its renewal spurs, and signs the deviation: negative when too few were left", () => {
    expect(pruningCheckBuds({ canesKept: 2, budsOnCanes: 24, renewalSpurs: 2 })).toBe(28);
    expect(pruningCheckBuds({ canesKept: 2, budsOnCanes: 24, renewalSpurs: 2 }, { plan: { budsPerRenewalSpur: 1 } })).toBe(26);
    expect(budDeviationPercent(24, 30)).toBe(-20);
    expect(budDeviationPercent(36, 30)).toBeCloseTo(20, 10);
    expect(() => budDeviationPercent(10, 0)).toThrow(/target/);
    expect(() => budDeviationPercent(-1, 10)).toThrow(/retained/);
    expect(() => pruningCheckBuds({ canesKept: 1.5, budsOnCanes: 10, renewalSpurs: 0 })).toThrow(/canesKept/);
    expect(() => observationSeverity('pruning-check', { prunedBy: 'p', canesKept: 2, budsOnCanes: 20, renewalSpurs: 1, budTarget: -1 })).toThrow(/budTarget/);
  });

  it('scores a note 0', () => {
    expect(observationSeverity('note', {})).toBe(0);
  });

  it('rejects an unknown kind, missing data and invalid fields with RangeErrors', () => {
    expect(() => observationSeverity('frost' as never, {} as never)).toThrow(/kind must be one of/);
    expect(() => observationSeverity('note', null as never)).toThrow(/data for 'note' must be an object/);
    expect(() => observationSeverity('cane-diameter', { diameterMm: 0 })).toThrow(/diameterMm/);
    expect(() => observationSeverity('shade-cane', { longestInternodeMm: 60, exposure: 'dusk' as never, colourGood: true })).toThrow(/exposure/);
    expect(() => observationSeverity('shade-cane', { longestInternodeMm: 60, exposure: 'sun', colourGood: true, diameterMm: -1 })).toThrow(/diameterMm/);
    expect(() => observationSeverity('weak-budbreak', { budsRetained: 10, budsPushed: 12 })).toThrow(/cannot exceed/);
    expect(() => observationSeverity('trunk-injury', { cause: 'cold', severity: 'light', girdlingPercent: 120 })).toThrow(/girdlingPercent/);
    expect(() => observationSeverity('trunk-injury', { cause: 'frost' as never, severity: 'light', girdlingPercent: 0 })).toThrow(/cause/);
    expect(() => observationSeverity('cane-injury', { cause: 'hail', canesAffected: 1.5, severity: 'light' })).toThrow(/canesAffected/);
    expect(() => observationSeverity('cane-injury', { cause: 'hail', canesAffected: 1, severity: 'awful' as never })).toThrow(/severity/);
    expect(() => observationSeverity('missing-vine', { state: 'gone' as never })).toThrow(/state/);
    expect(() => observationSeverity('bud-injury', { budsCut: 0, primariesDead: 0 })).toThrow(/budsCut/);
    expect(() => observationSeverity('pruning-record', { canesKept: -1, budsPerCane: 13, renewalSpurs: 2 })).toThrow(/canesKept/);
    expect(() => observationSeverity('pruning-record', { canesKept: 1, budsPerCane: 13, renewalSpurs: 2, budTarget: -5 })).toThrow(/budTarget/);
  });
});

describe('observation kinds', () => {
  it('are the kebab-case kinds of the sync contract, recognised by isObservationKind', () => {
    expect(OBSERVATION_KINDS).toEqual([
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
    ]);
    expect(isObservationKind('weak-budbreak')).toBe(true);
    expect(isObservationKind('Weak budbreak')).toBe(false);
    expect(isObservationKind(3)).toBe(false);
  });
});
