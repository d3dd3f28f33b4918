// One material: change it, or remove it when no job uses it. Jobs already planned keep
// the sheet they were given.
import type { Metadata } from 'next';
import Link from 'next/link';
import { forbidden, notFound } from 'next/navigation';
import { ConfirmAction } from '@/components/machines/confirm-action';
import { MaterialForm } from '@/components/materials/material-form';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { listMaterialsWithUse } from '@/db/queries/materials';
import { getShopSettings } from '@/db/queries/shops';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { idSchema } from '@/lib/validation/ids';
import { deleteMaterialAction, updateMaterialAction } from '../actions';

export const metadata: Metadata = { title: 'Material' };

export default async function MaterialPage({ params }: { params: Promise<{ materialId: string }> }) {
  const user = await guardPage('materials');
  if (!canDo(user.role, 'materials:write')) forbidden();
  const { materialId: raw } = await params;
  const id = idSchema.safeParse(raw);
  if (!id.success || !/^\d+$/.test(raw)) notFound();
  const [materials, shop] = await Promise.all([listMaterialsWithUse(user.shopId), getShopSettings(user.shopId)]);
  const material = materials.find((m) => m.id === id.data);
  if (!material) notFound();
  return (
    <>
      <PageHeader
        title={material.name}
        lead={material.jobCount === 0 ? 'No job uses this material yet.' : material.jobCount === 1 ? '1 job uses this material.' : `${material.jobCount} jobs use this material.`}
        actions={
          <Link href="/materials" className="font-bold text-spruce underline underline-offset-4">
            Back to materials
          </Link>
        }
      />
      <div className="grid items-start gap-8 lg:grid-cols-[2fr_1fr]">
        <MaterialForm unit={shop.lengthUnit} currency={shop.currency} material={material} action={updateMaterialAction} />
        <section aria-labelledby="remove-material-title" className="flex flex-col gap-3 rounded-md border-2 border-rule bg-panel p-5">
          <h2 id="remove-material-title">Remove</h2>
          {material.jobCount > 0 ? (
            <Notice tone="note" title="In use">
              Jobs name this material, so it stays. Change their material first if it must go.
            </Notice>
          ) : (
            <>
              <p className="text-ink-soft">No job uses it, so it can be removed.</p>
              <ConfirmAction action={deleteMaterialAction} hidden={{ materialId: material.id }} label="Remove material" question={`Remove ${material.name}?`} confirmLabel="Yes, remove" />
            </>
          )}
        </section>
      </div>
    </>
  );
}
