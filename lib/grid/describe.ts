/** Words for what the canvas shows, for screen readers and the status line: one cell, one row. */
import { cellLevel, cellSlot } from '@/lib/grid/cells';
import { levelLabel, SLOT_LABELS, vineAddress } from '@/lib/grid/labels';

/** "Row 14, post 6, vine 3: Act now. Replant." */
export function describeCell(row: number, position: number, code: number, vinesPerPanel?: number | null): string {
  const slot = cellSlot(code);
  const level = cellLevel(code);
  const parts = [`${vineAddress(row, position, vinesPerPanel)}: ${levelLabel(level)}.`];
  if (slot !== 'planted' && slot !== 'none') parts.push(`${SLOT_LABELS[slot]} slot.`);
  return parts.join(' ');
}

function vines(positions: number[], limit = 8) {
  const shown = positions.slice(0, limit).join(', ');
  return positions.length > limit ? `${shown} and ${positions.length - limit} more` : shown;
}

/** "Row 1: 2 act now (vines 3, 9); 1 act this season (vine 40); 5 watch; 1 missing, 1 dead." */
export function describeRow(row: number, codes: readonly number[]): string {
  const urgent: number[] = [];
  const act: number[] = [];
  let watch = 0;
  let missing = 0;
  let dead = 0;
  codes.forEach((code, i) => {
    const slot = cellSlot(code);
    if (slot === 'missing') missing++;
    if (slot === 'dead') dead++;
    const level = cellLevel(code);
    if (level === 3) urgent.push(i + 1);
    else if (level === 2) act.push(i + 1);
    else if (level === 1) watch++;
  });
  const parts: string[] = [];
  const list = (n: number[]) => `(vine${n.length > 1 ? 's' : ''} ${vines(n)})`;
  if (urgent.length) parts.push(`${urgent.length} act now ${list(urgent)}`);
  if (act.length) parts.push(`${act.length} act this season ${list(act)}`);
  if (watch) parts.push(`${watch} watch`);
  const holes = [missing && `${missing} missing`, dead && `${dead} dead`].filter(Boolean).join(', ');
  if (holes) parts.push(holes);
  return `Row ${row}: ${parts.length ? parts.join('; ') : 'no findings'}.`;
}

/** The next cell at or past `from` (row-major, wrapping) whose level is at least `least`, or null. */
export function nextProblem(cells: readonly (readonly number[])[], from: { r: number; c: number }, least: number, step: 1 | -1 = 1) {
  const width = Math.max(0, ...cells.map((row) => row.length));
  const total = cells.length * width;
  let i = from.r * width + from.c;
  for (let n = 0; n < total; n++) {
    i = (i + step + total) % total;
    const r = Math.floor(i / width);
    const c = i % width;
    const code = cells[r]?.[c];
    if (code === undefined) continue;
    const level = cellLevel(code);
    if (level !== null && level >= least) return { r, c };
  }
  return null;
}
