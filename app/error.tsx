'use client';
// The last-resort error page for a render that failed: a plain message and a retry,
// never a blank screen or a stack trace.
import { Button } from '@/components/ui/button';

export default function ErrorPage({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto flex min-h-[60vh] max-w-xl flex-col justify-center gap-4 p-8">
      <p className="font-mono text-3xl font-bold text-stop">Error</p>
      <h1>This page could not be shown</h1>
      <p className="text-ink-soft">Something went wrong on the server. Try again; if it keeps happening, tell your admin.</p>
      <div>
        <Button onClick={reset}>Try again</Button>
      </div>
    </main>
  );
}
