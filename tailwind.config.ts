import type { Config } from 'tailwindcss';

/**
 * Vineward's look: dark "cane bark" text on a pale "lime-wash" ground, a deep "rootstock" green
 * for actions and a "pruning-cut" amber for attention. Every text colour here passes WCAG AA on
 * the ground colour, and the main pairs pass AAA, for reading in low winter sun.
 */
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ground: '#f7f5ee',
        panel: '#ffffff',
        bark: { DEFAULT: '#1d1a16', soft: '#4a443b', faint: '#6b6458' },
        rootstock: { DEFAULT: '#244a2a', hover: '#1b3a20', tint: '#e3eee0' },
        cut: { DEFAULT: '#8a4b00', tint: '#fbeed8' },
        alarm: { DEFAULT: '#a3161a', tint: '#fbe3e1' },
        line: '#d8d2c2',
      },
      fontFamily: {
        sans: ['"Atkinson Hyperlegible Next Variable"', 'system-ui', 'sans-serif'],
        mono: ['"Atkinson Hyperlegible Mono Variable"', 'ui-monospace', 'monospace'],
      },
      minHeight: { touch: '3rem' },
      minWidth: { touch: '3rem' },
    },
  },
};

export default config;
