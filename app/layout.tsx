// Root layout: fonts, global styles, page title template. Every page renders per
// request (connection()), never at build time: Next.js puts the request's CSP nonce
// (proxy.ts) on its inline scripts only while rendering, and a page built ahead would
// carry scripts without one, which the policy blocks.
import type { Metadata } from 'next';
import { connection } from 'next/server';
import type { ReactNode } from 'react';
import { monoFont, textFont } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Kerfcast', template: '%s · Kerfcast' },
  description: 'G-code preview, run-time estimates, through-cut checks and quotes for CNC router shops.',
};

export default async function RootLayout({ children }: { children: ReactNode }) {
  await connection();
  return (
    <html lang="en" className={`${textFont.variable} ${monoFont.variable}`}>
      <body>{children}</body>
    </html>
  );
}
