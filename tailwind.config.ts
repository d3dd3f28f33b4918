// Kerfcast's look for the shop floor (reasons in docs/style.md): a warm light ground,
// near-black ink, one deep teal for actions, and four message tones of our own (a
// blue, a slate, a violet and a raspberry, deliberately not a green/amber/red set)
// that are always paired with a word and a shape, never used as the only signal. The
// type scale starts at 18 px so a table is readable at arm's length from the machine.
// tests/unit/style/palette-contrast.test.ts checks the pairings the pages use.
import type { Config } from 'tailwindcss';
import { PATH_COLOURS } from './lib/viewer/palette';

const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    colors: {
      transparent: 'transparent',
      current: 'currentColor',
      white: '#ffffff',
      // ground and text: ink on ground 16.2:1, soft 9.1:1, faint 5.5:1 (WCAG 2.1 formula, computed)
      ground: '#f6f4ef',
      panel: '#ffffff',
      ink: { DEFAULT: '#15181c', soft: '#3d434b', faint: '#5c636c' },
      // control borders reach 3:1 against ground and panel (WCAG 2.1 SC 1.4.11): rule is
      // 3.8:1 and 4.2:1; rule-light is for dividers that carry no meaning
      rule: { DEFAULT: '#767d86', light: '#c9ccd1' },
      // the one action colour (buttons, the current page): white on spruce is 8.0:1.
      // Statuses and messages never use it.
      spruce: { DEFAULT: '#0b5a57', dark: '#073f3d', light: '#d7ecea' },
      // message and status tones, as text on their own tint 6.1 to 6.7:1, on panel 7.7 to 8.3:1
      ok: { DEFAULT: '#1f4f8a', tint: '#dfe8f5' },
      note: { DEFAULT: '#46505c', tint: '#e7e9ec' },
      caution: { DEFAULT: '#6a3590', tint: '#efe3f6' },
      fault: { DEFAULT: '#a3123f', tint: '#f9dde6' },
      // dark surfaces (navigation bar, table heads, later the 3D viewer background);
      // edge is the border of a control on them: 5.3:1 on night, 4.5:1 on raised
      night: { DEFAULT: '#1b2026', raised: '#262d35', line: '#4a535e', edge: '#8a939e' },
      // the 3D viewer's path and marker colours, one list with the scene (lib/viewer/palette.ts)
      path: { ...PATH_COLOURS },
    },
    fontFamily: {
      sans: ['var(--font-text)', 'system-ui', 'sans-serif'],
      mono: ['var(--font-mono)', 'ui-monospace', 'monospace'],
    },
    fontSize: {
      // [size, line height]; a ratio of about 1.2 between steps
      xs: ['0.9375rem', { lineHeight: '1.4' }], // 15 px: captions only
      sm: ['1rem', { lineHeight: '1.5' }], // 16 px: secondary text
      base: ['1.125rem', { lineHeight: '1.55' }], // 18 px: body and tables
      lg: ['1.3125rem', { lineHeight: '1.45' }], // 21 px
      xl: ['1.5625rem', { lineHeight: '1.35' }], // 25 px: page titles on small screens
      '2xl': ['1.875rem', { lineHeight: '1.25' }], // 30 px: page titles
      '3xl': ['2.25rem', { lineHeight: '1.2' }], // 36 px: large figures (run time)
    },
    extend: {
      spacing: {
        // 44 px: the smallest target for a gloved finger or a quick click (WCAG 2.2 SC 2.5.5 AAA)
        target: '2.75rem',
      },
      borderWidth: { 3: '3px' },
      outlineWidth: { 3: '3px' },
      maxWidth: { page: '80rem' },
    },
  },
  plugins: [],
};

export default config;
