// The title row of a page, with an optional line of context and actions on the right.
import type { ReactNode } from 'react';

export function PageHeader({ title, lead, actions }: { title: string; lead?: string; actions?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b-2 border-rule-light pb-4">
      <div>
        <h1>{title}</h1>
        {lead ? <p className="mt-1 text-ink-soft">{lead}</p> : null}
      </div>
      {actions}
    </div>
  );
}
