// The body of an error page (403, 404): the code, what happened, and the way back.
// A div, not <main>: inside the signed-in shell it sits within the layout's <main>.
import Link from 'next/link';
import type { ReactNode } from 'react';

export function StatusPage({ code, codeClass, title, children, testId }: { code: string; codeClass: string; title: string; children: ReactNode; testId?: string }) {
  return (
    <div className="mx-auto flex min-h-[60vh] max-w-xl flex-col justify-center gap-4 p-8" data-testid={testId}>
      <p className={`font-mono text-3xl font-bold ${codeClass}`}>{code}</p>
      <h1>{title}</h1>
      <p className="text-ink-soft">{children}</p>
      <p>
        <Link href="/" className="font-bold text-spruce underline underline-offset-4">
          Go to your start page
        </Link>
      </p>
    </div>
  );
}
