/**
 * Drawing one cell on a canvas: the level's fill and mark, the slot's hatching or replant notch.
 * Shared by the grid and its legend so the legend is always the grid's own drawing.
 */
import { cellLevel, cellSlot, isEmptySlot } from '@/lib/grid/cells';
import { GRID_LINE, levelStyle, REPLANT_NOTCH, SLOT_STYLES, type Mark } from '@/lib/grid/palette';

type Ctx = Pick<
  CanvasRenderingContext2D,
  | 'fillStyle'
  | 'strokeStyle'
  | 'lineWidth'
  | 'lineCap'
  | 'fillRect'
  | 'strokeRect'
  | 'beginPath'
  | 'moveTo'
  | 'lineTo'
  | 'arc'
  | 'fill'
  | 'stroke'
  | 'closePath'
  | 'save'
  | 'restore'
  | 'rect'
  | 'clip'
>;

function drawMark(ctx: Ctx, mark: Mark, x: number, y: number, size: number, ink: string) {
  if (mark === 'none') return;
  const c = size / 2;
  const unit = Math.max(1, size / 12);
  ctx.fillStyle = ink;
  ctx.strokeStyle = ink;
  ctx.lineCap = 'round';
  ctx.beginPath();
  switch (mark) {
    case 'ring':
      ctx.lineWidth = Math.max(1, unit);
      ctx.arc(x + c, y + c, size * 0.2, 0, Math.PI * 2);
      ctx.stroke();
      break;
    case 'dot':
      ctx.arc(x + c, y + c, size * 0.17, 0, Math.PI * 2);
      ctx.fill();
      break;
    case 'bar':
      ctx.fillRect(x + c - unit * 1.25, y + size * 0.2, unit * 2.5, size * 0.6);
      break;
    case 'cross': {
      const a = size * 0.24;
      ctx.lineWidth = unit * 2.2;
      ctx.moveTo(x + a, y + a);
      ctx.lineTo(x + size - a, y + size - a);
      ctx.moveTo(x + size - a, y + a);
      ctx.lineTo(x + a, y + size - a);
      ctx.stroke();
      break;
    }
  }
}

function hatch(ctx: Ctx, x: number, y: number, size: number, colour: string, rising: boolean, lines: number) {
  ctx.save();
  ctx.beginPath();
  ctx.rect(x, y, size, size);
  ctx.clip();
  ctx.strokeStyle = colour;
  ctx.lineWidth = Math.max(1, size / 12);
  ctx.lineCap = 'butt';
  ctx.beginPath();
  const step = Math.max(3, (2 * size) / (lines + 1));
  for (let o = -size; o <= size; o += step) {
    if (rising) {
      ctx.moveTo(x + o, y + size);
      ctx.lineTo(x + o + size, y);
    } else {
      ctx.moveTo(x + o, y);
      ctx.lineTo(x + o + size, y + size);
    }
  }
  ctx.stroke();
  ctx.restore();
}

/** Draws the cell whose top-left corner is (x, y); `size` includes a one-pixel gap on the right and bottom. */
export function drawCell(ctx: Ctx, code: number, x: number, y: number, size: number) {
  const slot = cellSlot(code);
  if (slot === 'none') return;
  const inner = size > 6 ? size - 1 : size;
  if (isEmptySlot(slot)) {
    const style = SLOT_STYLES[slot];
    ctx.fillStyle = style.fill;
    ctx.fillRect(x, y, inner, inner);
    // Missing: light with three thin rising lines; dead: dark, struck through once the other way.
    hatch(ctx, x, y, inner, style.hatch, style.pattern === 'rising', slot === 'missing' ? 5 : 1);
  } else {
    const style = levelStyle(cellLevel(code));
    ctx.fillStyle = style.fill;
    ctx.fillRect(x, y, inner, inner);
    if (inner >= 8) drawMark(ctx, style.mark, x, y, inner, style.ink);
    if (slot === 'replant') {
      const n = Math.max(5, inner * 0.48);
      ctx.fillStyle = '#ffffff';
      ctx.beginPath();
      ctx.moveTo(x, y);
      ctx.lineTo(x + n + 1.5, y);
      ctx.lineTo(x, y + n + 1.5);
      ctx.closePath();
      ctx.fill();
      ctx.fillStyle = REPLANT_NOTCH;
      ctx.beginPath();
      ctx.moveTo(x, y);
      ctx.lineTo(x + n, y);
      ctx.lineTo(x, y + n);
      ctx.closePath();
      ctx.fill();
    }
  }
  if (inner >= 8) {
    ctx.strokeStyle = GRID_LINE;
    ctx.lineWidth = 1;
    ctx.strokeRect(x + 0.5, y + 0.5, inner - 1, inner - 1);
  }
}
