'use client';
// The last-resort error page for a render that failed: a plain message and a retry,
// never a blank screen or a stack trace. Next.js gives an error thrown in a Server
// Component a digest (its reference in the server log); an error without one happened in the
// browser, so the page does not blame the server for it.
import { Button } from '@/components/ui/button';

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  const fromServer = Boolean(error.digest);
  return (
    <main className="mx-auto flex min-h-[60vh] max-w-xl flex-col justify-center gap-4 p-8">
      <p className="font-mono text-3xl font-bold text-fault">Error</p>
      <h1>This page could not be shown</h1>
      <p className="text-ink-soft">
        {fromServer
          ? 'The server could not put this page together. Try again; if it keeps happening, tell your admin and give them the reference below.'
          : 'Something on this page stopped working in your browser. Try again, or reload the page; if it keeps happening, tell your admin what you were doing.'}
      </p>
      {fromServer ? (
        <p className="text-sm text-ink-soft">
          Reference: <span className="figure">{error.digest}</span>
        </p>
      ) : null}
      <div>
        <Button onClick={reset}>Try again</Button>
      </div>
    </main>
  );
}
