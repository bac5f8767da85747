/**
 * The grid's colours and marks. Severity runs from pale to dark (luminance falls at every step), so
 * the order survives glare, grey-scale printing and every common colour-vision deficiency; each
 * level also carries its own mark, so no reading depends on colour alone. Slots without a vine get
 * hatching instead of a fill colour. Contrast is checked in tests/unit/grid-palette.test.ts.
 */
import type { Level, Slot } from '@/lib/grid/cells';

export type Mark = 'none' | 'ring' | 'dot' | 'bar' | 'cross';

export interface LevelStyle {
  fill: string;
  mark: Mark;
  ink: string;
}

/** Index 0 is "nothing recorded", then severities 0–3. */
export const LEVEL_STYLES: readonly LevelStyle[] = [
  { fill: '#ffffff', mark: 'none', ink: '#1d1a16' },
  { fill: '#d3e4ee', mark: 'ring', ink: '#1f3a4a' },
  { fill: '#f5d35c', mark: 'dot', ink: '#1d1a16' },
  { fill: '#dd7416', mark: 'bar', ink: '#1d1a16' },
  { fill: '#6e1232', mark: 'cross', ink: '#ffffff' },
];

export const levelStyle = (level: Level): LevelStyle => LEVEL_STYLES[level === null ? 0 : level + 1]!;

export interface SlotStyle {
  fill: string;
  hatch: string;
  /** Hatching direction: "/" or "\\"; none for slots that show their vine's level. */
  pattern: 'none' | 'rising' | 'falling';
}

export const SLOT_STYLES: Record<Slot, SlotStyle> = {
  planted: { fill: '', hatch: '', pattern: 'none' },
  // A young vine keeps its level colour and gets a corner notch.
  replant: { fill: '', hatch: '', pattern: 'none' },
  missing: { fill: '#ebe7dc', hatch: '#4a443b', pattern: 'rising' },
  dead: { fill: '#4a443b', hatch: '#ebe7dc', pattern: 'falling' },
  none: { fill: '', hatch: '', pattern: 'none' },
};

export const REPLANT_NOTCH = '#1f5a2c';
export const GRID_BACKGROUND = '#f7f5ee';
export const GRID_LINE = '#b9b19f';
export const LABEL_BAND = '#efece3';
export const LABEL_INK = '#1d1a16';
export const ACTIVE_OUTLINE = '#1d1a16';
export const SELECTED_OUTLINE = '#0057b8';

/** WCAG relative luminance of a #rrggbb colour. */
export function luminance(hex: string): number {
  const channel = (i: number) => {
    const c = parseInt(hex.slice(1 + 2 * i, 3 + 2 * i), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel(0) + 0.7152 * channel(1) + 0.0722 * channel(2);
}

/** WCAG contrast ratio between two #rrggbb colours, 1 to 21. */
export function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}
