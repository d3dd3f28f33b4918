// Machines list: each router's travel, default hold-down, hourly rate, tool library size
// and profile version, archived machines apart; the shop's length unit for admins.
import type { Metadata } from 'next';
import Link from 'next/link';
import { LengthUnitForm } from '@/components/machines/length-unit-form';
import { DataTable } from '@/components/ui/data-table';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { listMachines, type MachineSummary } from '@/db/queries/machines';
import { getShopSettings } from '@/db/queries/shops';
import { whoMay } from '@/lib/auth/messages';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { formatLength, LENGTH_UNIT_LABELS, unitSymbol, type LengthUnit } from '@/lib/units/length';
import { formatMinor } from '@/lib/units/money';
import { HOLD_DOWN_LABELS } from '@/lib/validation/enums';
import { setLengthUnitAction } from './actions';

export const metadata: Metadata = { title: 'Machines' };

function machineColumns(unit: LengthUnit, currency: string) {
  return [
    {
      key: 'name',
      header: 'Machine',
      cell: (m: MachineSummary) => (
        <Link href={`/machines/${m.id}`} className="font-bold text-spruce underline underline-offset-4">
          {m.name}
        </Link>
      ),
    },
    {
      key: 'travel',
      header: `Travel X × Y × Z (${unitSymbol('length', unit)})`,
      cell: (m: MachineSummary) => <span className="figure whitespace-nowrap">{[m.travelXMm, m.travelYMm, m.travelZMm].map((v) => formatLength(v, unit)).join(' × ')}</span>,
    },
    { key: 'hold', header: 'Default hold-down', cell: (m: MachineSummary) => HOLD_DOWN_LABELS[m.defaultHoldDown] },
    { key: 'rate', header: `Hourly rate (${currency})`, numeric: true, cell: (m: MachineSummary) => formatMinor(m.hourlyRateMinor, currency) },
    { key: 'tools', header: 'Tools', numeric: true, cell: (m: MachineSummary) => m.toolCount },
    { key: 'version', header: 'Profile version', numeric: true, cell: (m: MachineSummary) => `v${m.version}` },
  ];
}

export default async function MachinesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await guardPage('machines');
  const [all, shop, query] = await Promise.all([listMachines(user.shopId, 'include'), getShopSettings(user.shopId), searchParams]);
  const active = all.filter((m) => m.archivedAt === null);
  const archived = all.filter((m) => m.archivedAt !== null);
  const mayWrite = canDo(user.role, 'machines:write');
  const unit = shop.lengthUnit;
  const columns = machineColumns(unit, shop.currency);
  return (
    <>
      <PageHeader
        title="Machines"
        lead="Machine profiles the estimates are computed for. Open a machine for its profile, tools and versions."
        actions={
          mayWrite ? (
            <Link href="/machines/new" className="inline-flex min-h-target items-center rounded-md border-2 border-spruce bg-spruce px-4 font-bold text-white hover:bg-spruce-dark">
              New machine
            </Link>
          ) : null
        }
      />
      <div className="grid items-start gap-8 lg:grid-cols-[3fr_1fr]">
        <div className="flex flex-col gap-8">
          {query.removed ? <Notice tone="ok" title="Machine removed." role="status" /> : null}
          <section aria-label="Machines in use">
            {active.length === 0 ? (
              <Notice tone="note" title="No machines yet." role="status">
                {mayWrite ? 'Add the first one with “New machine”.' : `${whoMay('machines:write', true)} can add a machine profile.`}
              </Notice>
            ) : (
              <DataTable caption="Machines of your shop" rows={active} rowKey={(m) => m.id} columns={columns} />
            )}
          </section>
          {archived.length > 0 ? (
            <section aria-labelledby="archived-title" className="flex flex-col gap-3">
              <h2 id="archived-title">Archived</h2>
              <p className="text-ink-soft">Kept because estimates or jobs use them. They are not offered for new jobs; their profiles stay readable.</p>
              <DataTable caption="Archived machines" rows={archived} rowKey={(m) => m.id} columns={columns} />
            </section>
          ) : null}
        </div>
        <aside className="flex flex-col gap-4">
          {canDo(user.role, 'shop:write') ? (
            <LengthUnitForm unit={unit} action={setLengthUnitAction} />
          ) : (
            <Notice tone="note" title={`Lengths in ${LENGTH_UNIT_LABELS[unit].toLowerCase()}`}>
              {`The shop's setting; ${whoMay('shop:write')} can change it.`}
            </Notice>
          )}
        </aside>
      </div>
    </>
  );
}
