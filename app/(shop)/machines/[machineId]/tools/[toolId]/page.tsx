// One tool of a machine: change it or take it out of the library (both save a new
// profile version, unless only the description changed).
import type { Metadata } from 'next';
import Link from 'next/link';
import { forbidden, notFound } from 'next/navigation';
import { ConfirmAction } from '@/components/machines/confirm-action';
import { ToolForm } from '@/components/machines/tool-form';
import { PageHeader } from '@/components/ui/page-header';
import { getMachine } from '@/db/queries/machines';
import { getShopSettings } from '@/db/queries/shops';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { idSchema } from '@/lib/validation/ids';
import { removeToolAction, updateToolAction } from '../../../actions';

export const metadata: Metadata = { title: 'Tool' };

export default async function ToolPage({ params }: { params: Promise<{ machineId: string; toolId: string }> }) {
  const user = await guardPage('machines');
  if (!canDo(user.role, 'machines:write')) forbidden();
  const p = await params;
  const machineId = idSchema.safeParse(p.machineId);
  const toolId = idSchema.safeParse(p.toolId);
  if (!machineId.success || !toolId.success || !/^\d+$/.test(p.machineId) || !/^\d+$/.test(p.toolId)) notFound();
  const [machine, shop] = await Promise.all([getMachine(user.shopId, machineId.data), getShopSettings(user.shopId)]);
  const tool = machine?.tools.find((t) => t.id === toolId.data);
  if (!machine || !tool) notFound();
  if (machine.archivedAt) notFound();
  return (
    <>
      <PageHeader
        title={`Tool ${tool.number} of ${machine.name}`}
        lead={`Profile version ${machine.version}. Changing the tool saves version ${machine.version + 1}.`}
        actions={
          <Link href={`/machines/${machine.id}`} className="font-bold text-spruce underline underline-offset-4">
            Back to {machine.name}
          </Link>
        }
      />
      <div className="grid items-start gap-8 lg:grid-cols-[2fr_1fr]">
        <ToolForm machineId={machine.id} unit={shop.lengthUnit} tool={tool} action={updateToolAction} />
        <section aria-labelledby="remove-tool-title" className="flex flex-col gap-3 rounded-md border-2 border-rule bg-panel p-5">
          <h2 id="remove-tool-title">Remove</h2>
          <p className="text-ink-soft">Older profile versions keep the tool, so estimates made with them read as before.</p>
          <ConfirmAction
            action={removeToolAction}
            hidden={{ machineId: machine.id, toolId: tool.id }}
            label="Remove tool"
            question={`Remove tool ${tool.number} from ${machine.name}?`}
            confirmLabel="Yes, remove"
          />
        </section>
      </div>
    </>
  );
}
