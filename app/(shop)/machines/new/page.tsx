// A new machine profile: every field of the CLI's profile, in the shop's length unit.
import type { Metadata } from 'next';
import Link from 'next/link';
import { forbidden } from 'next/navigation';
import { MachineForm } from '@/components/machines/machine-form';
import { PageHeader } from '@/components/ui/page-header';
import { getShopSettings } from '@/db/queries/shops';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { saveMachineAction } from '../actions';

export const metadata: Metadata = { title: 'New machine' };

export default async function NewMachinePage() {
  const user = await guardPage('machines');
  if (!canDo(user.role, 'machines:write')) forbidden();
  const shop = await getShopSettings(user.shopId);
  return (
    <>
      <PageHeader
        title="New machine"
        lead="Take the values from the machine's manual or its controller's settings; every field says what the estimate does with it."
        actions={
          <Link href="/machines" className="font-bold text-spruce underline underline-offset-4">
            Back to machines
          </Link>
        }
      />
      <MachineForm
        unit={shop.lengthUnit}
        currency={shop.currency}
        initial={{ flat: { 'homeMm.x': 0, 'homeMm.y': 0, 'homeMm.z': 0, timeFactor: 1 }, hourlyRateMinor: null, defaultHoldDown: 'vacuum', defaultVacuumKpa: null }}
        tools={[]}
        action={saveMachineAction}
      />
    </>
  );
}
