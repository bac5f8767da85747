import { describe, expect, it } from 'vitest';
import {
  cellLevel,
  cellSlot,
  encodeCell,
  GRID_KINDS,
  kindCounts,
  vinesPerKind,
  packRow,
  rowCodes,
  SLOTS,
  unpackRow,
  type Level,
  type RawGridRow,
} from '@/lib/grid/cells';
import { describeCell, describeRow, nextProblem } from '@/lib/grid/describe';
import { gridFiltersToSearch, parseGridFilters, readGridFilters } from '@/lib/grid/filters';
import { decodeCursor, encodeCursor, parsePhotoFilters, readPhotoFilters } from '@/lib/grid/photo-filters';
import { summariseGrid } from '@/lib/grid/summary';
import { planFromObservations } from '@/lib/grid/vine-plan';
import { planVine, wilsonInterval } from '@/lib/viticulture';

const P = (level: Level) => encodeCell('planted', level);

describe('grid cell codes', () => {
  it('round-trip every slot and level through one small integer, as the SQL builds them', () => {
    const levels: Level[] = [null, 0, 1, 2, 3];
    for (const slot of SLOTS) {
      for (const level of levels) {
        const code = encodeCell(slot, level);
        expect([cellSlot(code), cellLevel(code)]).toEqual([slot, level]);
      }
    }
    // The SQL in lib/server/queries/grid.ts: slot index × 5 + (severity + 1, or 0).
    expect(encodeCell('planted', null)).toBe(0);
    expect(encodeCell('replant', 3)).toBe(9);
    expect(encodeCell('missing', 2)).toBe(13);
    expect(encodeCell('dead', null)).toBe(15);
    expect(encodeCell('none', null)).toBe(20);
  });

  it('send a row as one plain letter per vine and read every code back', () => {
    const every = SLOTS.flatMap((slot) => ([null, 0, 1, 2, 3] as Level[]).map((level) => encodeCell(slot, level)));
    const text = packRow(every);
    expect(text).toBe('ABCDEFGHIJKLMNOPQRSTUVWXY');
    // Nothing JSON would have to escape, so a row costs one byte a vine on the wire.
    expect(JSON.stringify(text)).toBe(`"${text}"`);
    expect(unpackRow(text)).toEqual(every);
    expect(unpackRow(packRow([]))).toEqual([]);
    const long = Array.from({ length: 5000 }, (_, i) => i % 25);
    expect(unpackRow(packRow(long))).toEqual(long);
  });
});

describe('rows from the grid statement', () => {
  const pack = (position: number, value: number) => position * 4 + value;

  it('lay out a row: planted by default, other slots by status, worst findings on top', () => {
    // Slot 2 replant, 4 missing, 5 dead; vine 1 act now, vine 2 watch, vine 4 act this season.
    const codes = rowCodes([7, 6, [pack(2, 1), pack(4, 2), pack(5, 3)], null, [pack(1, 3), pack(2, 1), pack(4, 2)], 6, null, 3]);
    expect(codes).toEqual([encodeCell('planted', 3), encodeCell('replant', 1), P(null), encodeCell('missing', 2), encodeCell('dead', null), P(null)]);
  });

  it('mark positions a row lacks as no slot: past its last slot, or in the gaps it lists', () => {
    expect(rowCodes([1, 4, null, null, null, 2, null, 0])).toEqual([P(null), P(null), encodeCell('none', null), encodeCell('none', null)]);
    expect(rowCodes([1, 4, null, [1, 4], [pack(4, 0)], 4, null, 1])).toEqual([P(null), encodeCell('none', null), encodeCell('none', null), P(0)]);
    expect(rowCodes([1, 3, null, null, null, 0, null, 0])).toEqual(Array(3).fill(encodeCell('none', null)));
  });

  it('count vines per kind from their kind bits across rows, a vine once for each kind it shows', () => {
    const packed = (position: number, mask: number) => position * 65536 + mask;
    const row = (kinds: number[] | null): RawGridRow => [1, 10, null, null, null, 10, kinds, kinds?.length ?? 0];
    // Bits 3 and 4 are kinds 2 and 3; bit 0 (a kind the grid does not know) counts for none.
    const rows = [row([packed(1, 8), packed(2, 8), packed(3, 24)]), row(null), row([packed(10000, 8), packed(4, 1)])];
    expect(vinesPerKind(rows, 5)).toEqual([0, 0, 3 + 1, 1, 0]);
  });

  it('count findings by kind and severity, and vines affected per kind from their kind bits', () => {
    const counts: [string, number, number][] = [
      ['weak-budbreak', 0, 4],
      ['weak-budbreak', 2, 3],
      ['trunk-injury', 3, 2],
      ['note', 0, 1],
    ];
    // 2 vines with budbreak only, 1 with both, 1 with trunk injury only.
    const vines = GRID_KINDS.map((kind) => ({ 'weak-budbreak': 3, 'trunk-injury': 2 })[kind] ?? 0);
    expect(kindCounts(GRID_KINDS, counts, vines)).toEqual([
      { kind: 'note', bySeverity: [1, 0, 0, 0], vinesAffected: 0 },
      { kind: 'trunk-injury', bySeverity: [0, 0, 0, 2], vinesAffected: 2 },
      { kind: 'weak-budbreak', bySeverity: [4, 0, 3, 0], vinesAffected: 3 },
    ]);
  });
});

describe('the grid summary', () => {
  const rows = [1, 2];
  const cells = [
    [P(3), P(2), P(1), P(0), P(null), encodeCell('missing', 2)],
    [encodeCell('dead', null), P(3), encodeCell('replant', 1), P(null)],
  ];

  it('counts vines by worst level and slot, and ranks rows by problem vines, then act-now vines', () => {
    const s = summariseGrid(rows, cells, [], 7);
    expect(s.byLevel).toEqual({ watch: 2, act: 2, urgent: 2 });
    expect(s.slots).toEqual({ planted: 7, replant: 1, missing: 1, dead: 1, none: 0 });
    expect(s.worstRows).toEqual([
      { row: 1, problems: 4, urgent: 1 },
      { row: 2, problems: 2, urgent: 1 },
    ]);
  });

  it('gives each kind its Wilson interval among the vines scouted, and none when nothing was scouted', () => {
    const kinds = [{ kind: 'trunk-injury' as const, bySeverity: [0, 1, 2, 1] as [number, number, number, number], vinesAffected: 3 }];
    const s = summariseGrid(rows, cells, kinds, 40);
    expect(s.kinds[0]).toMatchObject({ observations: 4, incidence: wilsonInterval(3, 40) });
    expect(summariseGrid(rows, cells, kinds, 0).kinds[0]!.incidence).toBeNull();
  });

  it('keeps pruning records, pruning checks and notes out of the findings: counted, with no incidence', () => {
    const sev = (n: number) => [n, 0, 1, 0] as [number, number, number, number];
    const kinds = [
      { kind: 'pruning-record' as const, bySeverity: sev(10), vinesAffected: 1 },
      { kind: 'trunk-injury' as const, bySeverity: sev(0), vinesAffected: 1 },
      { kind: 'pruning-check' as const, bySeverity: sev(3), vinesAffected: 1 },
      { kind: 'note' as const, bySeverity: sev(0), vinesAffected: 0 },
    ];
    const s = summariseGrid(rows, cells, kinds, 40);
    expect(s.kinds.map((k) => k.kind)).toEqual(['trunk-injury']);
    expect(s.kinds[0]!.incidence).toEqual(wilsonInterval(1, 40));
    expect(s.records.map((k) => [k.kind, k.observations, k.incidence])).toEqual([
      ['pruning-record', 11, null],
      ['pruning-check', 4, null],
      ['note', 1, null],
    ]);
  });

  it('counts missing or dead vines over every slot, scouted or not, as the season report does', () => {
    const holes = [{ kind: 'missing-vine' as const, bySeverity: [0, 0, 2, 0] as [number, number, number, number], vinesAffected: 2 }];
    // 10 slots in the two rows (7 planted, 1 replant, 1 missing, 1 dead), though only 3 vines were scouted.
    expect(summariseGrid(rows, cells, holes, 3).kinds[0]!.incidence).toEqual(wilsonInterval(2, 10));
    expect(summariseGrid(rows, cells, holes, 0).kinds[0]!.incidence).toEqual(wilsonInterval(2, 10));
  });
});

describe('words for the canvas', () => {
  it('read one cell with its post address and slot, and one row as counts with the worst vines named', () => {
    expect(describeCell(14, 28, P(3), 5)).toBe('Row 14, post 6, vine 3: Act now.');
    expect(describeCell(2, 7, encodeCell('replant', 0), null)).toBe('Row 2, vine 7: Fine. Replant slot.');
    expect(describeCell(2, 8, encodeCell('dead', null), null)).toBe('Row 2, vine 8: Nothing recorded. Dead slot.');
    expect(describeRow(3, [P(3), P(2), P(1), P(1), encodeCell('missing', null), P(3)])).toBe(
      'Row 3: 2 act now (vines 1, 6); 1 act this season (vine 2); 2 watch; 1 missing.',
    );
    expect(describeRow(4, [P(null), P(0)])).toBe('Row 4: no findings.');
    expect(describeRow(5, Array(12).fill(P(3)))).toBe('Row 5: 12 act now (vines 1, 2, 3, 4, 5, 6, 7, 8 and 4 more).');
  });

  it('find the next and previous vine at a level, wrapping round the block and skipping short rows', () => {
    const grid = [[P(null), P(3), P(2)], [P(3)], [P(1), P(null), P(3)]];
    expect(nextProblem(grid, { r: 0, c: 0 }, 3)).toEqual({ r: 0, c: 1 });
    expect(nextProblem(grid, { r: 0, c: 1 }, 3)).toEqual({ r: 1, c: 0 });
    expect(nextProblem(grid, { r: 2, c: 2 }, 3)).toEqual({ r: 0, c: 1 });
    expect(nextProblem(grid, { r: 0, c: 1 }, 3, -1)).toEqual({ r: 2, c: 2 });
    expect(nextProblem(grid, { r: 0, c: 0 }, 2)).toEqual({ r: 0, c: 1 });
    expect(nextProblem([[P(0)]], { r: 0, c: 0 }, 1)).toBeNull();
  });
});

describe('grid filters in the URL', () => {
  it('read kinds as a list or repeated, default to open findings, and write one canonical string', () => {
    const f = parseGridFilters(new URLSearchParams('kind=weak-budbreak,trunk-injury&kind=trunk-injury&from=2026-04-01&flagged=1'));
    expect(f).toEqual({ kind: ['trunk-injury', 'weak-budbreak'], from: '2026-04-01', status: 'open', flagged: true });
    expect(gridFiltersToSearch(f).toString()).toBe('kind=trunk-injury%2Cweak-budbreak&from=2026-04-01&flagged=1');
    expect(gridFiltersToSearch(parseGridFilters(new URLSearchParams(''))).toString()).toBe('');
  });

  it('refuse what they cannot read, naming the field', () => {
    expect(() => parseGridFilters(new URLSearchParams('kind=frost'))).toThrow(/Unknown observation kind: frost/);
    expect(() => parseGridFilters(new URLSearchParams('from=2026-05-02&to=2026-05-01'))).toThrow(/on or after/);
  });

  it('on the page, keep every readable value of a hand-edited URL and dates out of order for the form to flag', () => {
    expect(readGridFilters(new URLSearchParams('kind=frost&status=closed'))).toEqual({ kind: [], status: 'closed', flagged: false });
    expect(readGridFilters(new URLSearchParams('from=2026-05-02&to=2026-05-01'))).toMatchObject({ from: '2026-05-02', to: '2026-05-01' });
  });

  it('for photos, need a block before a row, and drop a lone row on the page', () => {
    expect(() => parsePhotoFilters(new URLSearchParams('row=3'))).toThrow(/Choose a block/);
    expect(readPhotoFilters(new URLSearchParams('row=3&severity=2'))).toEqual({ kind: [], severity: 2, row: undefined });
  });

  it('carry the photo cursor as an opaque token and reject a forged one', () => {
    const cursor = { at: '2026-03-04T09:00:00.123456Z', id: '0b10c4a0-0000-4000-8000-000000000002' };
    expect(decodeCursor(encodeCursor(cursor))).toEqual(cursor);
    expect(encodeCursor(cursor)).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(decodeCursor('bm90LWEtY3Vyc29y')).toBeNull();
    expect(decodeCursor('%%%')).toBeNull();
  });
});

describe('a vine’s pruning plan from its records', () => {
  const cane = (diameterMm: number, observedAt: string, extra: object = {}) => ({ kind: 'cane-diameter', data: { diameterMm, ...extra }, observedAt });

  it('plans from the canes of the latest measuring day and the latest pruning weight, through planVine', () => {
    const reading = planFromObservations('cane', [
      cane(5, '2026-01-10T09:00:00Z'),
      cane(9.5, '2026-01-20T09:00:00Z', { exposure: 'sun' }),
      { kind: 'shade-cane', data: { longestInternodeMm: 130, exposure: 'shade', colourGood: true, diameterMm: 8 }, observedAt: '2026-01-20T10:00:00Z' },
      cane(11, '2026-01-20T11:00:00Z'),
      { kind: 'pruning-record', data: { canesKept: 2, budsPerCane: 13, renewalSpurs: 2, pruningWeightKg: 0.6 }, observedAt: '2025-12-01T09:00:00Z' },
      { kind: 'pruning-record', data: { canesKept: 2, budsPerCane: 13, renewalSpurs: 2, pruningWeightKg: 0.8 }, observedAt: '2026-01-21T09:00:00Z' },
    ]);
    const canes = [
      { baseDiameterMm: 9.5, exposure: 'sun' as const },
      { baseDiameterMm: 8, longestInternodeMm: 130, exposure: 'shade' as const, colourGood: true },
      { baseDiameterMm: 11 },
    ];
    expect(reading).toMatchObject({ measuredOn: '2026-01-20', pruningWeightKg: 0.8, canes, reason: null });
    expect(reading.plan).toEqual(planVine({ trainingSystem: 'cane', canes, pruningWeight: 0.8, weightUnit: 'kg' }));
  });

  it('says why there is no plan: no canes measured, or a training system without one', () => {
    expect(planFromObservations('cane', [])).toMatchObject({ plan: null, reason: 'No canes measured on this vine yet.' });
    expect(planFromObservations('other', [cane(9, '2026-01-20T09:00:00Z')]).plan).toBeNull();
    expect(planFromObservations('spur', [cane(9, '2026-01-20T09:00:00Z')]).plan).toEqual(planVine({ trainingSystem: 'spur', canes: [{ baseDiameterMm: 9 }] }));
  });

  it('reads the plan per foot of row and caps spurs by the cordon when the vine spacing is known (Ohio State primer: 4–6 buds a foot)', () => {
    const canes = Array.from({ length: 30 }, (_, i) => cane(9.5, `2026-01-20T09:${String(i).padStart(2, '0')}:00Z`));
    // 4 lb of prunings (1.814 kg) under 20 + 20: 80 buds, at 5 ft (1.524 m) spacing 16 a foot.
    const heavy = [
      ...canes,
      { kind: 'pruning-record', data: { canesKept: 2, budsPerCane: 13, renewalSpurs: 2, pruningWeightKg: 4 * 0.45359237 }, observedAt: '2026-01-21T09:00:00Z' },
    ];
    const reading = planFromObservations('spur', heavy, 1.524);
    expect(reading.plan!.targetBuds).toBe(80);
    expect(reading.budLoad).toMatchObject({ reading: 'over', rangePerVine: { min: 20, max: 30 } });
    expect(reading.budLoad!.budsPerFt).toBeCloseTo(16, 9);
    // 1524 mm of cordon at one spur per 3 in (76.2 mm, UMN Extension): 20 spurs.
    expect(reading.plan!.keep).toHaveLength(20);
    expect(planFromObservations('spur', heavy).budLoad).toBeNull();
  });
});
