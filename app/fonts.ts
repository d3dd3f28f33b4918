// The two shipped faces, loaded with next/font/local from public/fonts (licences
// beside the files): Atkinson Hyperlegible for text, designed for legibility with
// clearly distinct letterforms (I l 1, O 0), and JetBrains Mono for G-code and figures.
import localFont from 'next/font/local';

export const textFont = localFont({
  src: [
    { path: '../public/fonts/atkinson-hyperlegible/atkinson-hyperlegible-latin-400-normal.woff2', weight: '400', style: 'normal' },
    { path: '../public/fonts/atkinson-hyperlegible/atkinson-hyperlegible-latin-700-normal.woff2', weight: '700', style: 'normal' },
  ],
  variable: '--font-text',
  display: 'swap',
  fallback: ['system-ui', 'sans-serif'],
});

export const monoFont = localFont({
  src: [{ path: '../public/fonts/jetbrains-mono/jetbrains-mono-latin-400-normal.woff2', weight: '400', style: 'normal' }],
  variable: '--font-mono',
  display: 'swap',
  fallback: ['ui-monospace', 'monospace'],
});
