'use client';
// The dashboard could not be read (the database gone, a bug): say so in place, keep the
// navigation, and offer a retry.
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

export default function DashboardError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="flex flex-col gap-4">
      <h1>Dashboard</h1>
      <Notice tone="fault" title="The dashboard could not be read just now." role="alert">
        Try again; if it keeps happening, tell your admin{error.digest ? ` and give them the reference ${error.digest}` : ''}.
      </Notice>
      <div>
        <Button onClick={reset}>Try again</Button>
      </div>
    </div>
  );
}
