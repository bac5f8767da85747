'use client';

import { useEffect, useRef } from 'react';
import { drawCell } from '@/lib/grid/draw';

/** One cell drawn exactly as the grid draws it, for the legend and the vine panel. */
export function CellSwatch({ code, size = 28 }: { code: number; size?: number }) {
  const ref = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    const canvas = ref.current;
    const ctx = canvas?.getContext('2d');
    if (!canvas || !ctx) return;
    const dpr = window.devicePixelRatio || 1;
    canvas.width = size * dpr;
    canvas.height = size * dpr;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, size, size);
    drawCell(ctx, code, 0, 0, size + 1);
  }, [code, size]);
  return <canvas ref={ref} style={{ width: size, height: size }} className="shrink-0" aria-hidden="true" />;
}
