// Root layout: fonts, global styles, page title template.
import type { Metadata } from 'next';
import type { ReactNode } from 'react';
import { monoFont, textFont } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Kerfcast', template: '%s · Kerfcast' },
  description: 'G-code preview, run-time estimates, through-cut checks and quotes for CNC router shops.',
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${textFont.variable} ${monoFont.variable}`}>
      <body>{children}</body>
    </html>
  );
}
