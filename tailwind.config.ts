// Kerfcast's look for the shop floor (reasons in docs/style.md): a warm light ground,
// near-black ink, one deep teal for actions, and four status tones that are always
// paired with a word and a shape, never used as the only signal. The type scale
// starts at 18 px so a table is readable at arm's length from the machine.
import type { Config } from 'tailwindcss';

const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    colors: {
      transparent: 'transparent',
      current: 'currentColor',
      white: '#ffffff',
      // ground and text: ink on ground 16.2:1, soft 9.1:1, faint 5.5:1 (WCAG 2.2 formula, computed)
      ground: '#f6f4ef',
      panel: '#ffffff',
      ink: { DEFAULT: '#15181c', soft: '#3d434b', faint: '#5c636c' },
      // borders must reach 3:1 against ground (WCAG 2.2 SC 1.4.11): rule is 3.8:1 (computed)
      rule: { DEFAULT: '#767d86', light: '#c9ccd1' },
      // the one action colour: white on spruce is 8.0:1 (computed)
      spruce: { DEFAULT: '#0b5a57', dark: '#073f3d', light: '#d7ecea' },
      // status tones as text on their own tint: 5.5 to 6.7:1 (computed), above 4.5:1
      go: { DEFAULT: '#1d6a2c', tint: '#dcefdc' },
      hold: { DEFAULT: '#7a4d00', tint: '#fbeccb' },
      stop: { DEFAULT: '#a1171b', tint: '#f8dcdc' },
      info: { DEFAULT: '#1c4a9c', tint: '#dde6f6' },
      // dark surfaces (navigation bar, later the 3D viewer background)
      night: { DEFAULT: '#1b2026', raised: '#262d35', line: '#4a535e' },
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
