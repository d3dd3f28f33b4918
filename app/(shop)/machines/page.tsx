// Machines list: each router's travel, default hold-down and size of its tool library.
import type { Metadata } from 'next';
import { DataTable } from '@/components/ui/data-table';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { listMachines } from '@/db/queries/machines';
import { whoMay } from '@/lib/auth/messages';
import { guardPage } from '@/lib/auth/page-guard';
import { HOLD_DOWN_LABELS } from '@/lib/validation/enums';

export const metadata: Metadata = { title: 'Machines' };

export default async function MachinesPage() {
  const user = await guardPage('machines');
  const machines = await listMachines(user.shopId);
  return (
    <>
      <PageHeader title="Machines" lead="Machine profiles the estimates are computed for." />
      {machines.length === 0 ? (
        <Notice tone="note" title="No machines yet." role="status">{`${whoMay('machines:write', true)} can add a machine profile.`}</Notice>
      ) : (
        <DataTable
          caption="Machines of your shop"
          rows={machines}
          rowKey={(m) => m.id}
          columns={[
            { key: 'name', header: 'Machine', cell: (m) => <span className="font-bold">{m.name}</span> },
            { key: 'travel', header: 'Travel X × Y × Z (mm)', cell: (m) => <span className="figure">{`${m.travelXMm} × ${m.travelYMm} × ${m.travelZMm}`}</span> },
            { key: 'hold', header: 'Default hold-down', cell: (m) => HOLD_DOWN_LABELS[m.defaultHoldDown] },
            { key: 'tools', header: 'Tools', numeric: true, cell: (m) => m.toolCount },
            { key: 'version', header: 'Profile version', numeric: true, cell: (m) => `v${m.version}` },
          ]}
        />
      )}
    </>
  );
}
