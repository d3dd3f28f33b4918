// The 403 page: shown, with status 403, when a role opens a page the role table
// does not give it.
// A div, not <main>: inside the signed-in shell it sits within the layout's <main>.
import Link from 'next/link';

export default function Forbidden() {
  return (
    <div className="mx-auto flex min-h-[60vh] max-w-xl flex-col justify-center gap-4 p-8" data-testid="forbidden-page">
      <p className="font-mono text-3xl font-bold text-stop">403</p>
      <h1>This page is not open to your role</h1>
      <p className="text-ink-soft">
        Your account can sign in, but its role does not include this page. Ask your shop&apos;s admin if you need it.
      </p>
      <p>
        <Link href="/" className="font-bold text-spruce underline underline-offset-4">
          Go to your start page
        </Link>
      </p>
    </div>
  );
}
