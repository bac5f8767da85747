/**
 * The passes of a season's winter and spring work, in the order a block usually sees them:
 * machine pre-pruning, hand pruning (cutting and choosing canes and renewal spurs), pulling the
 * brush off the wires, tying the kept canes down, and shoot thinning in spring.
 */
export const ROW_WORK_PASSES = ['pre-pruning', 'pruning', 'brush-removal', 'tying', 'shoot-thinning'] as const;
export type RowWorkPass = (typeof ROW_WORK_PASSES)[number];

export const PASS_LABELS: Record<RowWorkPass, string> = {
  'pre-pruning': 'Pre-pruning',
  pruning: 'Pruning',
  'brush-removal': 'Brush removal',
  tying: 'Tying',
  'shoot-thinning': 'Shoot thinning',
};

export const isRowWorkPass = (value: unknown): value is RowWorkPass => typeof value === 'string' && (ROW_WORK_PASSES as readonly string[]).includes(value);
