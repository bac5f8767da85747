'use client';

import { useCallback, useEffect, useLayoutEffect, useRef, type KeyboardEvent, type MouseEvent } from 'react';
import { cellSlot } from '@/lib/grid/cells';
import { describeCell } from '@/lib/grid/describe';
import { drawCell } from '@/lib/grid/draw';
import { ACTIVE_OUTLINE, GRID_BACKGROUND, LABEL_BAND, LABEL_INK } from '@/lib/grid/palette';

export interface CellRef {
  r: number;
  c: number;
}

interface GridCanvasProps {
  rows: number[];
  cells: number[][];
  cellSize: number;
  active: CellRef;
  selected: CellRef | null;
  vinesPerPanel: number | null;
  label: string;
  onActiveChange: (cell: CellRef) => void;
  onSelect: (cell: CellRef | null) => void;
}

const LABEL_W = 48;
const LABEL_H = 30;
const FONT = '"Atkinson Hyperlegible Next Variable", system-ui, sans-serif';

/**
 * The grid drawn on one canvas the size of the visible box: only the cells in view are drawn, on
 * every scroll frame, so a 150 × 150 block costs the same as a small one. A transparent scroller
 * with a full-size spacer sits on top and gives native (touch, wheel, keyboard) scrolling. The row
 * and vine labels are drawn last, at the edges, so they stay in view. For assistive technology the
 * scroller is an ARIA grid whose only rendered cell is the active one.
 */
export function GridCanvas({ rows, cells, cellSize: cs, active, selected, vinesPerPanel, label, onActiveChange, onSelect }: GridCanvasProps) {
  const scrollerRef = useRef<HTMLDivElement>(null);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const frame = useRef(0);
  const drawnOnce = useRef(false);
  const width = cells.reduce((max, row) => Math.max(max, row.length), 0);

  const draw = useCallback(() => {
    const scroller = scrollerRef.current;
    const canvas = canvasRef.current;
    if (!scroller || !canvas) return;
    const w = scroller.clientWidth;
    const h = scroller.clientHeight;
    const dpr = window.devicePixelRatio || 1;
    if (canvas.width !== Math.round(w * dpr) || canvas.height !== Math.round(h * dpr)) {
      canvas.width = Math.round(w * dpr);
      canvas.height = Math.round(h * dpr);
      canvas.style.width = `${w}px`;
      canvas.style.height = `${h}px`;
    }
    const ctx = canvas.getContext('2d');
    if (!ctx) return;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.fillStyle = GRID_BACKGROUND;
    ctx.fillRect(0, 0, w, h);
    const sx = scroller.scrollLeft;
    const sy = scroller.scrollTop;
    const c0 = Math.max(0, Math.floor(sx / cs));
    const c1 = Math.min(width - 1, Math.floor((sx + w - LABEL_W) / cs));
    const r0 = Math.max(0, Math.floor(sy / cs));
    const r1 = Math.min(rows.length - 1, Math.floor((sy + h - LABEL_H) / cs));
    const x = (c: number) => LABEL_W + c * cs - sx;
    const y = (r: number) => LABEL_H + r * cs - sy;
    for (let r = r0; r <= r1; r++) {
      const codes = cells[r]!;
      const last = Math.min(c1, codes.length - 1);
      for (let c = c0; c <= last; c++) drawCell(ctx, codes[c]!, x(c), y(r), cs);
    }

    if (selected) {
      // Dark and light rings together stay visible on every fill.
      ctx.lineWidth = 3;
      ctx.strokeStyle = ACTIVE_OUTLINE;
      ctx.strokeRect(x(selected.c) - 1.5, y(selected.r) - 1.5, cs + 2, cs + 2);
      ctx.lineWidth = 1.5;
      ctx.strokeStyle = '#ffffff';
      ctx.strokeRect(x(selected.c) + 0.75, y(selected.r) + 0.75, cs - 2.5, cs - 2.5);
    }
    if (document.activeElement === scroller) {
      ctx.setLineDash([4, 3]);
      ctx.lineWidth = 2.5;
      ctx.strokeStyle = '#ffffff';
      ctx.strokeRect(x(active.c) - 2.5, y(active.r) - 2.5, cs + 4, cs + 4);
      ctx.lineDashOffset = 3.5;
      ctx.strokeStyle = ACTIVE_OUTLINE;
      ctx.strokeRect(x(active.c) - 2.5, y(active.r) - 2.5, cs + 4, cs + 4);
      ctx.setLineDash([]);
      ctx.lineDashOffset = 0;
    }

    ctx.fillStyle = LABEL_BAND;
    ctx.fillRect(0, 0, w, LABEL_H);
    ctx.fillRect(0, 0, LABEL_W, h);
    ctx.fillStyle = LABEL_INK;
    ctx.textBaseline = 'middle';
    ctx.textAlign = 'center';
    const fontPx = Math.min(15, Math.max(12, cs * 0.55));
    ctx.font = `700 ${fontPx}px ${FONT}`;
    // Label every vine when there is room, else every 5th or 10th (and vine 1).
    const vineStep = cs >= 30 ? 1 : cs * 5 >= 44 ? 5 : 10;
    for (let c = c0; c <= c1; c++) {
      const position = c + 1;
      if (position === 1 || position % vineStep === 0) ctx.fillText(String(position), x(c) + cs / 2, LABEL_H / 2, Math.max(cs * vineStep - 2, cs));
    }
    const rowStep = cs >= 16 ? 1 : cs * 2 >= 16 ? 2 : 5;
    ctx.textAlign = 'right';
    for (let r = r0; r <= r1; r++) {
      if (r % rowStep === 0 || r === active.r) ctx.fillText(String(rows[r]), LABEL_W - 8, y(r) + cs / 2);
    }
    ctx.fillStyle = LABEL_BAND;
    ctx.fillRect(0, 0, LABEL_W, LABEL_H);
    ctx.fillStyle = LABEL_INK;
    ctx.font = `700 11px ${FONT}`;
    ctx.textAlign = 'left';
    ctx.fillText('Row', 4, LABEL_H - 8);
    ctx.textAlign = 'right';
    ctx.fillText('Vine', LABEL_W - 3, 9);

    if (!drawnOnce.current && cells.length) {
      drawnOnce.current = true;
      performance.mark('vw-grid-drawn');
      requestAnimationFrame(() => performance.mark('vw-grid-painted'));
    }
  }, [rows, cells, cs, width, active, selected]);

  const schedule = useCallback(() => {
    cancelAnimationFrame(frame.current);
    frame.current = requestAnimationFrame(draw);
  }, [draw]);

  useLayoutEffect(draw, [draw]);

  useEffect(() => {
    const scroller = scrollerRef.current;
    if (!scroller) return;
    const observer = new ResizeObserver(schedule);
    observer.observe(scroller);
    return () => {
      observer.disconnect();
      cancelAnimationFrame(frame.current);
    };
  }, [schedule]);

  // Keep the active cell in view, clear of the label bands.
  useEffect(() => {
    const scroller = scrollerRef.current;
    if (!scroller) return;
    const left = active.c * cs;
    const top = active.r * cs;
    const viewW = scroller.clientWidth - LABEL_W;
    const viewH = scroller.clientHeight - LABEL_H;
    if (left < scroller.scrollLeft) scroller.scrollLeft = left;
    else if (left + cs > scroller.scrollLeft + viewW) scroller.scrollLeft = left + cs - viewW;
    if (top < scroller.scrollTop) scroller.scrollTop = top;
    else if (top + cs > scroller.scrollTop + viewH) scroller.scrollTop = top + cs - viewH;
  }, [active, cs]);

  const codeAt = (cell: CellRef) => cells[cell.r]?.[cell.c];
  const usable = (cell: CellRef) => {
    const code = codeAt(cell);
    return code !== undefined && cellSlot(code) !== 'none';
  };

  function move(dr: number, dc: number, absolute?: Partial<CellRef>) {
    const r = Math.max(0, Math.min(rows.length - 1, absolute?.r ?? active.r + dr));
    const rowLength = cells[r]?.length ?? 0;
    const c = Math.max(0, Math.min(rowLength - 1, absolute?.c ?? active.c + dc));
    onActiveChange({ r, c });
  }

  function onKeyDown(e: KeyboardEvent<HTMLDivElement>) {
    const last = (cells[active.r]?.length ?? 1) - 1;
    const keys: Record<string, () => void> = {
      ArrowLeft: () => move(0, -1),
      ArrowRight: () => move(0, 1),
      ArrowUp: () => move(-1, 0),
      ArrowDown: () => move(1, 0),
      PageUp: () => move(-10, 0),
      PageDown: () => move(10, 0),
      Home: () => (e.ctrlKey ? move(0, 0, { r: 0, c: 0 }) : move(0, 0, { c: 0 })),
      End: () => (e.ctrlKey ? move(0, 0, { r: rows.length - 1, c: (cells[rows.length - 1]?.length ?? 1) - 1 }) : move(0, 0, { c: last })),
      Enter: () => usable(active) && onSelect(active),
      ' ': () => usable(active) && onSelect(active),
      Escape: () => onSelect(null),
    };
    const action = keys[e.key];
    if (!action) return;
    e.preventDefault();
    action();
  }

  function onClick(e: MouseEvent<HTMLDivElement>) {
    const scroller = e.currentTarget;
    const rect = scroller.getBoundingClientRect();
    const px = e.clientX - rect.left - scroller.clientLeft;
    const py = e.clientY - rect.top - scroller.clientTop;
    if (px < LABEL_W || py < LABEL_H) return;
    const cell = { r: Math.floor((py - LABEL_H + scroller.scrollTop) / cs), c: Math.floor((px - LABEL_W + scroller.scrollLeft) / cs) };
    if (!usable(cell)) return;
    onActiveChange(cell);
    onSelect(cell);
  }

  const activeCode = codeAt(active);
  const activeText = activeCode === undefined ? '' : describeCell(rows[active.r]!, active.c + 1, activeCode, vinesPerPanel);
  const contentH = LABEL_H + rows.length * cs;

  return (
    <div className="flex flex-col gap-2">
      <div className="relative overflow-hidden rounded-xl border-2 border-line" style={{ height: `min(${contentH + 18}px, 68dvh)` }}>
        <canvas ref={canvasRef} className="absolute inset-0" aria-hidden="true" />
        <div
          ref={scrollerRef}
          role="grid"
          aria-label={label}
          aria-rowcount={rows.length}
          aria-colcount={width}
          aria-activedescendant="grid-active-cell"
          aria-describedby="grid-keys"
          tabIndex={0}
          data-testid="row-grid"
          data-cell-size={cs}
          data-label-width={LABEL_W}
          data-label-height={LABEL_H}
          className="absolute inset-0 cursor-pointer overflow-auto overscroll-contain focus-visible:outline-offset-[-3px]"
          onScroll={schedule}
          onKeyDown={onKeyDown}
          onClick={onClick}
          onFocus={schedule}
          onBlur={schedule}
        >
          <div style={{ width: LABEL_W + width * cs, height: contentH }} />
          <div role="row" aria-rowindex={active.r + 1} className="sr-only">
            <span role="gridcell" id="grid-active-cell" aria-colindex={active.c + 1} aria-selected={selected?.r === active.r && selected?.c === active.c}>
              {activeText}
            </span>
          </div>
        </div>
      </div>
      <p className="min-h-6 font-bold" aria-hidden="true" data-testid="grid-status">
        {activeText}
      </p>
      <p id="grid-keys" className="text-sm text-bark-soft">
        Tap a vine, or focus the grid and use the arrow keys, Page Up/Down for ten rows, Home/End, and Enter to open the vine.
      </p>
    </div>
  );
}
