// Buttons: one filled action style and one outlined secondary style, both at least
// 44 px tall so they can be hit quickly at the machine.
import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger';

const STYLES: Record<Variant, string> = {
  primary: 'bg-spruce text-white border-spruce hover:bg-spruce-dark',
  secondary: 'bg-panel text-ink border-rule hover:bg-ground',
  danger: 'bg-panel text-fault border-fault hover:bg-fault-tint',
};

export function Button({ variant = 'primary', className = '', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      {...props}
      className={`inline-flex min-h-target items-center justify-center gap-2 rounded-md border-2 px-4 font-bold disabled:cursor-not-allowed disabled:opacity-60 ${STYLES[variant]} ${className}`}
    />
  );
}
