// Plain, wide tables for lists: zebra rows for following a line across at arm's
// length, a caption for screen readers, numbers right-aligned in tabular figures.
import type { ReactNode } from 'react';

export interface Column<T> {
  key: string;
  header: string;
  cell: (row: T) => ReactNode;
  numeric?: boolean;
}

export function DataTable<T>({ caption, columns, rows, rowKey }: { caption: string; columns: Column<T>[]; rows: T[]; rowKey: (row: T) => string | number }) {
  return (
    <div className="overflow-x-auto rounded-md border-2 border-rule bg-panel">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-night text-white">
          <tr>
            {columns.map((c) => (
              <th key={c.key} scope="col" className={`px-4 py-3 font-bold ${c.numeric ? 'text-right' : ''}`}>
                {c.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={rowKey(row)} className="border-t border-rule-light even:bg-ground">
              {columns.map((c) => (
                <td key={c.key} className={`px-4 py-3 align-top ${c.numeric ? 'figure text-right' : ''}`}>
                  {c.cell(row)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
