import { describe, expect, it } from 'vitest';
import { contrast, LEVEL_STYLES, luminance, SLOT_STYLES } from '@/lib/grid/palette';

// Simulation matrices of Machado, Oliveira & Fernandes (IEEE TVCG 15:1291, 2009), severity 1.0,
// applied in linear RGB: what a person with each common colour-vision deficiency sees.
const SIMULATIONS = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
} as const;

const linear = (hex: string) =>
  [0, 1, 2].map((i) => {
    const c = parseInt(hex.slice(1 + 2 * i, 3 + 2 * i), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });

function simulatedLuminance(hex: string, m: readonly (readonly number[])[]) {
  const rgb = linear(hex);
  const [r, g, b] = m.map((row) => Math.min(1, Math.max(0, row[0]! * rgb[0]! + row[1]! * rgb[1]! + row[2]! * rgb[2]!)));
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
}

const ratio = (a: number, b: number) => (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);

describe('the grid palette', () => {
  it('computes WCAG contrast as published: black on white is 21:1, a colour on itself 1:1', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrast('#777777', '#777777')).toBe(1);
    // WebAIM's checker gives 4.48:1 for #777777 on white.
    expect(contrast('#777777', '#ffffff')).toBeCloseTo(4.48, 2);
  });

  it('draws every severity mark at 4.5:1 or more against its fill, readable in glare', () => {
    for (const style of LEVEL_STYLES.slice(1)) expect(contrast(style.ink, style.fill), style.mark).toBeGreaterThanOrEqual(4.5);
  });

  it('gives each level its own mark, so nothing depends on colour alone', () => {
    const marks = LEVEL_STYLES.map((s) => s.mark);
    expect(new Set(marks).size).toBe(marks.length);
  });

  it('darkens with every step from watch to act now, for normal vision and each colour-vision deficiency', () => {
    const problems = LEVEL_STYLES.slice(2).map((s) => s.fill);
    const views: [string, (hex: string) => number][] = [
      ['normal', luminance],
      ...Object.entries(SIMULATIONS).map(([name, m]) => [name, (hex: string) => simulatedLuminance(hex, m)] as [string, (hex: string) => number]),
    ];
    for (const [name, lum] of views) {
      for (let i = 1; i < problems.length; i++) {
        const [lighter, darker] = [lum(problems[i - 1]!), lum(problems[i]!)];
        expect(lighter, `${name}: level ${i} lighter than ${i + 1}`).toBeGreaterThan(darker);
        // Neighbouring problem levels stay at least 1.8:1 apart in lightness.
        expect(ratio(lighter, darker), `${name}: levels ${i} and ${i + 1}`).toBeGreaterThanOrEqual(1.8);
      }
    }
  });

  it('keeps missing and dead slots far apart in lightness, with hatching that shows on both', () => {
    const { missing, dead } = SLOT_STYLES;
    expect(contrast(missing.fill, dead.fill)).toBeGreaterThanOrEqual(4.5);
    expect(contrast(missing.hatch, missing.fill)).toBeGreaterThanOrEqual(4.5);
    expect(contrast(dead.hatch, dead.fill)).toBeGreaterThanOrEqual(4.5);
    expect(missing.pattern).not.toBe(dead.pattern);
  });
});
