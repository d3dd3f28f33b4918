'use client';
// A navigation link that marks the current page with aria-current and a thick
// underline bar (not colour alone).
import Link from 'next/link';
import { usePathname } from 'next/navigation';

export function NavLink({ href, label }: { href: string; label: string }) {
  const pathname = usePathname();
  const current = pathname === href || pathname.startsWith(`${href}/`);
  return (
    <Link
      href={href}
      aria-current={current ? 'page' : undefined}
      className={`flex min-h-target items-center border-b-4 px-3 font-bold focus-visible:outline-spruce-light ${
        current ? 'border-spruce-light text-white' : 'border-transparent text-rule-light hover:border-night-line hover:text-white'
      }`}
    >
      {label}
    </Link>
  );
}
