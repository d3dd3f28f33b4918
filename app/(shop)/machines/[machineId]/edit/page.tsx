// Editing a machine's profile. Saving a change to any profile field makes a new version;
// saving without a change makes none. Archived machines are not edited (restore first).
import type { Metadata } from 'next';
import Link from 'next/link';
import { forbidden, notFound } from 'next/navigation';
import { MachineForm } from '@/components/machines/machine-form';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { getMachine, machineRowToProfile } from '@/db/queries/machines';
import { getShopSettings } from '@/db/queries/shops';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { profileToFlat } from '@/lib/machines/profile-fields';
import { idSchema } from '@/lib/validation/ids';
import { saveMachineAction } from '../../actions';

export const metadata: Metadata = { title: 'Edit machine' };

export default async function EditMachinePage({ params }: { params: Promise<{ machineId: string }> }) {
  const user = await guardPage('machines');
  if (!canDo(user.role, 'machines:write')) forbidden();
  const { machineId: raw } = await params;
  const id = idSchema.safeParse(raw);
  if (!id.success || !/^\d+$/.test(raw)) notFound();
  const [machine, shop] = await Promise.all([getMachine(user.shopId, id.data), getShopSettings(user.shopId)]);
  if (!machine) notFound();
  const profile = machineRowToProfile(machine, machine.tools);
  const back = (
    <Link href={`/machines/${machine.id}`} className="font-bold text-spruce underline underline-offset-4">
      Back to {machine.name}
    </Link>
  );
  return (
    <>
      <PageHeader title={`Edit ${machine.name}`} lead={`Profile version ${machine.version}. A change saves version ${machine.version + 1}.`} actions={back} />
      {machine.archivedAt ? (
        <Notice tone="note" title="This machine is archived." role="status">
          Its profile is kept as it was. Restore it on its page to change it.
        </Notice>
      ) : (
        <MachineForm
          machineId={machine.id}
          unit={shop.lengthUnit}
          currency={shop.currency}
          initial={{ flat: profileToFlat(profile), hourlyRateMinor: machine.hourlyRateMinor, defaultHoldDown: machine.defaultHoldDown, defaultVacuumKpa: machine.defaultVacuumKpa }}
          tools={profile.tools}
          action={saveMachineAction}
        />
      )}
    </>
  );
}
