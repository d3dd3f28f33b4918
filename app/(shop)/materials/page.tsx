// Sheet materials: what job forms prefill the sheet from, and what quotes count sheets
// at. Lengths in the shop's unit, costs in its currency.
import type { Metadata } from 'next';
import Link from 'next/link';
import { MaterialForm } from '@/components/materials/material-form';
import { DataTable } from '@/components/ui/data-table';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { listMaterialsWithUse } from '@/db/queries/materials';
import { getShopSettings } from '@/db/queries/shops';
import { whoMay } from '@/lib/auth/messages';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { formatLength, unitSymbol } from '@/lib/units/length';
import { formatMinor } from '@/lib/units/money';
import { createMaterialAction } from './actions';

export const metadata: Metadata = { title: 'Materials' };

export default async function MaterialsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await guardPage('materials');
  const [materials, shop, query] = await Promise.all([listMaterialsWithUse(user.shopId), getShopSettings(user.shopId), searchParams]);
  const mayWrite = canDo(user.role, 'materials:write');
  const u = unitSymbol('length', shop.lengthUnit);
  return (
    <>
      <PageHeader title="Materials" lead="Sheet stock the shop cuts: a job takes its sheet size and thickness from here, a quote its cost per sheet." />
      <div className="grid items-start gap-8 lg:grid-cols-[2fr_1fr]">
        <section aria-label="Material list" className="flex flex-col gap-4">
          {query.saved ? <Notice tone="ok" title="Material saved." role="status" /> : null}
          {query.removed ? <Notice tone="ok" title="Material removed." role="status" /> : null}
          {materials.length === 0 ? (
            <Notice tone="note" title="No materials yet." role="status">
              {mayWrite ? 'Add the first one with the form.' : `${whoMay('materials:write', true)} can add materials.`}
            </Notice>
          ) : (
            <DataTable
              caption="Your shop's materials"
              rows={materials}
              rowKey={(m) => m.id}
              columns={[
                {
                  key: 'name',
                  header: 'Material',
                  cell: (m) =>
                    mayWrite ? (
                      <Link href={`/materials/${m.id}`} className="font-bold text-spruce underline underline-offset-4">
                        {m.name}
                      </Link>
                    ) : (
                      <span className="font-bold">{m.name}</span>
                    ),
                },
                { key: 'thickness', header: `Thickness (${u})`, numeric: true, cell: (m) => formatLength(m.thicknessMm, shop.lengthUnit) },
                {
                  key: 'sheet',
                  header: `Sheet W × L (${u})`,
                  numeric: true,
                  cell: (m) => <span className="whitespace-nowrap">{`${formatLength(m.sheetWidthMm, shop.lengthUnit)} × ${formatLength(m.sheetLengthMm, shop.lengthUnit)}`}</span>,
                },
                { key: 'cost', header: `Cost per sheet (${shop.currency})`, numeric: true, cell: (m) => formatMinor(m.costPerSheetMinor, shop.currency) },
                { key: 'jobs', header: 'Jobs', numeric: true, cell: (m) => m.jobCount },
              ]}
            />
          )}
        </section>
        {mayWrite ? <MaterialForm unit={shop.lengthUnit} currency={shop.currency} action={createMaterialAction} /> : null}
      </div>
    </>
  );
}
