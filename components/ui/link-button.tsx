// A link that looks like a button, for actions that open another page ("New job", "Edit"):
// the same 44 px target and styles as components/ui/button.tsx, but a real link, so it opens
// in a new tab and reads as a link to a screen reader.
import Link from 'next/link';
import type { ComponentProps } from 'react';

type Variant = 'primary' | 'secondary';

const STYLES: Record<Variant, string> = {
  primary: 'bg-spruce text-white border-spruce hover:bg-spruce-dark',
  secondary: 'bg-panel text-ink border-rule hover:bg-ground',
};

export function LinkButton({ variant = 'primary', className = '', ...props }: ComponentProps<typeof Link> & { variant?: Variant }) {
  return <Link {...props} className={`inline-flex min-h-target items-center justify-center gap-2 rounded-md border-2 px-4 font-bold no-underline ${STYLES[variant]} ${className}`} />;
}
