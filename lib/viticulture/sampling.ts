// How many vines a scout should look at, and which ones.
import { requireCount, requireFraction, requireOpenFraction, requirePositive } from './check';
import { zForConfidence } from './stats';

/**
 * Vines to sample to estimate a proportion within ±`marginOfError` at `confidence`, from a block of
 * `populationVines`, in the finite-population form of Krejcie & Morgan (1970):
 *   s = χ²·N·P(1−P) / (d²(N−1) + χ²·P(1−P)),  P = 0.5 (the widest case), χ² = z².
 * Rounded to the nearest vine, as their table is (500 → 217, not 218). WSU (M. Olmstead, "Yield
 * Estimation", 2006) gives the same answer: about 800 vines in an acre → sample 260.
 */
export function sampleSizeForProportion(populationVines: number, marginOfError = 0.05, confidence = 0.95): number {
  requireCount('populationVines', populationVines);
  requireOpenFraction('marginOfError', marginOfError);
  const chiSquare = zForConfidence(confidence) ** 2;
  const pq = 0.25;
  const s = (chiSquare * populationVines * pq) / (marginOfError ** 2 * (populationVines - 1) + chiSquare * pq);
  return Math.min(populationVines, Math.round(s));
}

/**
 * Vines to weigh or count to estimate a block's mean yield per vine within ±`marginPercent` of the
 * mean at `confidence`, from the coefficient of variation of vine yields (Wolpert & Vilas, "Estimating
 * vineyard yields: introduction to a simple, two-step method", AJEV Technical Brief, 1992):
 *   n = (z · CV / E)²,  rounded up; CV and E in percent of the mean.
 * CV 30% at ±10% and 95% gives (1.96 × 30 / 10)² = 34.6 → 35 vines. With `populationVines` the
 * finite-population correction n / (1 + (n − 1) / N) is applied. A proportion (Krejcie & Morgan) is
 * the wrong statistic for a mean yield: it asks for 260 of 800 vines whatever the vines' spread.
 */
export function sampleSizeForMean(cvPercent: number, marginPercent = 10, confidence = 0.95, populationVines?: number): number {
  requirePositive('cvPercent', cvPercent);
  requirePositive('marginPercent', marginPercent);
  const z = zForConfidence(confidence);
  const n0 = ((z * cvPercent) / marginPercent) ** 2;
  if (populationVines === undefined) return Math.max(2, Math.ceil(n0 - 1e-9));
  requireCount('populationVines', populationVines);
  const n = n0 / (1 + (n0 - 1) / populationVines);
  return Math.min(populationVines, Math.max(2, Math.ceil(n - 1e-9)));
}

/**
 * Vines to inspect to find a problem present on a share `prevalence` of vines with probability
 * `confidence`: n = ln(1 − confidence) / ln(1 − prevalence), rounded up (McSorley & Littell 1993,
 * Nematropica 23:177: 5% infested → 59 samples for 95%, 90 for 99%).
 */
export function detectionSampleSize(prevalence: number, confidence = 0.95): number {
  requireFraction('prevalence', prevalence);
  requireOpenFraction('confidence', confidence);
  if (prevalence === 0) throw new RangeError('prevalence must be greater than 0: an absent problem cannot be found');
  if (prevalence === 1) return 1;
  // The slack keeps an exact whole answer (e.g. 2.0000000000000004) from being rounded up to 3.
  return Math.max(1, Math.ceil(Math.log(1 - confidence) / Math.log(1 - prevalence) - 1e-9));
}

export interface VineAddress {
  row: number;
  position: number;
}

type RowSpec = { rows: readonly number[]; rowCount?: never; firstRow?: never } | { rowCount: number; firstRow?: number; rows?: never };

/**
 * A block for sampling: either the row numbers (`rows`) or a count of rows numbered from `firstRow`
 * (default 1). Positions in a row run from 1 to its `vinesPerRow` (one number for every row, or one per
 * row). `skip` lists missing positions, which are never offered.
 */
export type BlockLayout = RowSpec & {
  vinesPerRow: number | Readonly<Record<number, number>> | ReadonlyMap<number, number>;
  skip?: readonly VineAddress[];
};

export interface SamplingOptions {
  count: number;
  /** Same seed, same layout, same options: same plan, on every device. Only its low 32 bits count. */
  seed: number;
  /**
   * Share of the sample from edge rows (0–1). Left out, edge rows get their share of the block's
   * vines, so the plan stays unbiased; set it higher to watch the edges where problems often start.
   */
  edgeShare?: number;
  /** Rows counted as edge rows at each side of the block; default 1. */
  edgeRows?: number;
  /**
   * Vines skipped at each end of every row: UC IPM advises sampling "a few vines in from row ends",
   * away from the headland. Default 0 (no vines skipped).
   */
  avoidRowEnds?: number;
}

/**
 * A reproducible list of vines for a scout to walk, in walking order: rows ascending, direction
 * alternating from one visited row to the next (serpentine), so the scout never walks back down a row.
 *
 * The block is cut into strata: edge or interior rows × first or second half of the rows × first or
 * second half of each row (the quadrants). The count is split between edge and interior (by
 * `edgeShare`), then across quadrants in proportion to the vines available in each (largest
 * remainder), and vines are drawn at random within each stratum from a seeded generator (mulberry32),
 * never Math.random. No vine appears twice, none outside the layout or in `skip`; asking for as many
 * vines as are available, or more, returns all of them.
 */
export function samplingPlan(layout: BlockLayout, options: SamplingOptions): VineAddress[] {
  const count = requireCount('count', options.count);
  if (!Number.isSafeInteger(options.seed)) throw new RangeError(`seed must be a whole number, got ${String(options.seed)}`);
  const edgeRows = requireCount('edgeRows', options.edgeRows ?? 1);
  const avoidRowEnds = requireCount('avoidRowEnds', options.avoidRowEnds ?? 0);
  if (options.edgeShare !== undefined) requireFraction('edgeShare', options.edgeShare);

  const rows = rowNumbers(layout);
  const skipped = new Set((layout.skip ?? []).map((a) => key(a.row, a.position)));
  const strata: VineAddress[][] = Array.from({ length: 8 }, () => []);
  const firstHalfRows = Math.ceil(rows.length / 2);
  rows.forEach((row, index) => {
    const vines = vinesIn(layout.vinesPerRow, row);
    const edge = index < edgeRows || index >= rows.length - edgeRows;
    const rowHalf = index < firstHalfRows ? 0 : 1;
    const midPosition = Math.ceil(vines / 2);
    for (let position = 1 + avoidRowEnds; position <= vines - avoidRowEnds; position++) {
      if (skipped.has(key(row, position))) continue;
      strata[(edge ? 4 : 0) + rowHalf * 2 + (position <= midPosition ? 0 : 1)]!.push({ row, position });
    }
  });

  const available = strata.reduce((sum, s) => sum + s.length, 0);
  if (count >= available) return walkingOrder(strata.flat());

  const edgeAvailable = strata.slice(4).reduce((sum, s) => sum + s.length, 0);
  const edgeWanted = options.edgeShare === undefined ? (count * edgeAvailable) / available : count * options.edgeShare;
  // Whatever one group cannot supply is taken from the other; count < available, so both fit.
  const edgeCount = Math.min(edgeAvailable, Math.max(count - (available - edgeAvailable), Math.round(edgeWanted)));
  const quotas = [
    ...allocate(
      count - edgeCount,
      strata.slice(0, 4).map((s) => s.length),
    ),
    ...allocate(
      edgeCount,
      strata.slice(4).map((s) => s.length),
    ),
  ];

  const random = mulberry32(options.seed);
  const picked: VineAddress[] = [];
  strata.forEach((stratum, i) => picked.push(...drawWithoutReplacement(stratum, quotas[i]!, random)));
  return walkingOrder(picked);
}

function rowNumbers(layout: BlockLayout): number[] {
  let rows: number[];
  if (layout.rows !== undefined) {
    if (layout.rowCount !== undefined) throw new RangeError('give either rows or rowCount, not both');
    rows = layout.rows.map((row) => requireCount('row number', row));
    if (new Set(rows).size !== rows.length) throw new RangeError('rows must not repeat a row number');
  } else {
    const rowCount = requireCount('rowCount', layout.rowCount);
    const firstRow = requireCount('firstRow', layout.firstRow ?? 1);
    rows = Array.from({ length: rowCount }, (_, i) => firstRow + i);
  }
  return rows.sort((a, b) => a - b);
}

function vinesIn(vinesPerRow: BlockLayout['vinesPerRow'], row: number): number {
  if (typeof vinesPerRow === 'number') return requireCount('vinesPerRow', vinesPerRow);
  const vines = vinesPerRow instanceof Map ? vinesPerRow.get(row) : (vinesPerRow as Readonly<Record<number, number>>)[row];
  if (vines === undefined) throw new RangeError(`vinesPerRow has no entry for row ${row}`);
  return requireCount(`vinesPerRow for row ${row}`, vines);
}

/** Splits `total` over groups in proportion to their sizes (largest remainder); never above a size. */
function allocate(total: number, sizes: number[]): number[] {
  const sum = sizes.reduce((a, b) => a + b, 0);
  if (sum === 0) return sizes.map(() => 0);
  const exact = sizes.map((size) => (total * size) / sum);
  const quotas = exact.map(Math.floor);
  let left = total - quotas.reduce((a, b) => a + b, 0);
  const byRemainder = exact.map((value, i) => ({ i, rest: value - Math.floor(value) })).sort((a, b) => b.rest - a.rest || a.i - b.i);
  for (const { i } of byRemainder) {
    if (left === 0) break;
    if (quotas[i]! < sizes[i]!) {
      quotas[i]!++;
      left--;
    }
  }
  return quotas;
}

function drawWithoutReplacement<T>(items: readonly T[], k: number, random: () => number): T[] {
  const pool = items.slice();
  for (let i = 0; i < k; i++) {
    const j = i + Math.floor(random() * (pool.length - i));
    [pool[i], pool[j]] = [pool[j]!, pool[i]!];
  }
  return pool.slice(0, k);
}

function walkingOrder(vines: VineAddress[]): VineAddress[] {
  const rows = [...new Set(vines.map((v) => v.row))].sort((a, b) => a - b);
  const direction = new Map(rows.map((row, i) => [row, i % 2 === 0 ? 1 : -1]));
  return vines.sort((a, b) => a.row - b.row || (a.position - b.position) * (direction.get(a.row) ?? 1));
}

/** mulberry32: a small, fast 32-bit generator; plenty for spreading a sample, and the same everywhere. */
function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function key(row: number, position: number): string {
  return `${row}:${position}`;
}
