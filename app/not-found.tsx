// The 404 page: a missing page or a record of another shop look the same.
// A div, not <main>: inside the signed-in shell it sits within the layout's <main>.
import Link from 'next/link';

export default function NotFound() {
  return (
    <div className="mx-auto flex min-h-[60vh] max-w-xl flex-col justify-center gap-4 p-8">
      <p className="font-mono text-3xl font-bold text-ink-soft">404</p>
      <h1>Nothing here</h1>
      <p className="text-ink-soft">The page or record does not exist, or it belongs to another shop.</p>
      <p>
        <Link href="/" className="font-bold text-spruce underline underline-offset-4">
          Go to your start page
        </Link>
      </p>
    </div>
  );
}
