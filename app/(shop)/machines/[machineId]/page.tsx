// One machine: its profile (every field, with units and what it does), its tools, its
// versions, and for admins and programmers the ways to change it. Archived machines stay
// readable here. Another shop's machine is a 404.
import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ConfirmAction } from '@/components/machines/confirm-action';
import { ProfileView } from '@/components/machines/profile-view';
import { ToolForm } from '@/components/machines/tool-form';
import { CalibrationSection } from '@/components/runs/calibration-section';
import { VersionsTable } from '@/components/machines/versions-table';
import { DataTable } from '@/components/ui/data-table';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { getMachine, listMachineVersions, machineRowToProfile } from '@/db/queries/machines';
import { getShopSettings } from '@/db/queries/shops';
import { whoMay } from '@/lib/auth/messages';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { formatLength, unitSymbol } from '@/lib/units/length';
import { formatMinor } from '@/lib/units/money';
import { HOLD_DOWN_LABELS, TOOL_KIND_LABELS } from '@/lib/validation/enums';
import { idSchema } from '@/lib/validation/ids';
import { addToolAction, removeMachineAction, restoreMachineAction } from '../actions';

export const metadata: Metadata = { title: 'Machine' };

type Props = { params: Promise<{ machineId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

const archivedWhen = new Intl.DateTimeFormat('en-GB', { dateStyle: 'long', timeZone: 'UTC' });

export default async function MachinePage({ params, searchParams }: Props) {
  const user = await guardPage('machines');
  const { machineId: raw } = await params;
  const id = idSchema.safeParse(raw);
  if (!id.success || !/^\d+$/.test(raw)) notFound();
  const [machine, versions, shop, query] = await Promise.all([getMachine(user.shopId, id.data), listMachineVersions(user.shopId, id.data), getShopSettings(user.shopId), searchParams]);
  if (!machine) notFound();
  const unit = shop.lengthUnit;
  const mayWrite = canDo(user.role, 'machines:write');
  const archived = machine.archivedAt !== null;
  const editable = mayWrite && !archived;
  const profile = machineRowToProfile(machine, machine.tools);
  const nextNumber = machine.tools.reduce((n, t) => Math.max(n, t.number), 0) + 1;

  // the version the save produced travels in the address, so the message stays true after later changes on the page
  const savedVersion = typeof query.v === 'string' && /^\d+$/.test(query.v) ? Number(query.v) : machine.version;
  const SAVED: Record<string, string> = {
    created: `${machine.name} added as version 1. Add its tools below.`,
    version: `Saved as version ${savedVersion}.`,
    same: `Saved. No profile field changed, so the profile stays version ${savedVersion}.`,
    'tool-version': `Tool saved; the profile is now version ${savedVersion}.`,
    'tool-same': `Tool saved. Only the description changed, so the profile stays version ${savedVersion}.`,
    'tool-removed': `Tool removed; the profile is now version ${savedVersion}.`,
  };
  const savedNotice = typeof query.saved === 'string' ? (SAVED[query.saved] ?? null) : null;

  return (
    <>
      <PageHeader
        title={machine.name}
        lead={`Profile version ${machine.version}${archived ? ' · archived' : ''}. Lengths in ${unit === 'inch' ? 'inches' : 'millimetres'}.`}
        actions={
          editable ? (
            <Link href={`/machines/${machine.id}/edit`} className="inline-flex min-h-target items-center rounded-md border-2 border-spruce bg-spruce px-4 font-bold text-white hover:bg-spruce-dark">
              Edit profile
            </Link>
          ) : null
        }
      />
      <div className="flex flex-col gap-8">
        {savedNotice ? <Notice tone="ok" title={savedNotice} role="status" /> : null}
        {archived ? (
          <Notice tone="note" title={`Archived on ${archivedWhen.format(machine.archivedAt!)}.`}>
            Estimates or jobs use this machine, so it is kept as it was. It is not offered for new jobs.
            {mayWrite ? (
              <div className="mt-3">
                <ConfirmAction
                  action={restoreMachineAction}
                  hidden={{ machineId: machine.id }}
                  label="Restore machine"
                  question={`Restore ${machine.name}? It will be offered for new jobs again.`}
                  confirmLabel="Yes, restore"
                  variant="secondary"
                />
              </div>
            ) : null}
          </Notice>
        ) : null}

        <section aria-labelledby="profile-title" className="flex flex-col gap-3">
          <h2 id="profile-title">Profile</h2>
          <dl className="grid gap-4 rounded-md border-2 border-rule bg-panel p-4 sm:grid-cols-2">
            <div>
              <dt className="font-bold">Hourly rate ({shop.currency} per hour)</dt>
              <dd className="figure">{formatMinor(machine.hourlyRateMinor, shop.currency)}</dd>
            </div>
            <div>
              <dt className="font-bold">Default hold-down</dt>
              <dd>{HOLD_DOWN_LABELS[machine.defaultHoldDown]}</dd>
            </div>
            <div>
              <dt className="font-bold">Vacuum level (kPa)</dt>
              <dd className="figure">{machine.defaultVacuumKpa === null ? 'not given' : machine.defaultVacuumKpa}</dd>
            </div>
          </dl>
          <ProfileView profile={profile} unit={unit} />
        </section>

        <section aria-labelledby="tools-title" className="flex flex-col gap-3">
          <h2 id="tools-title">Tools</h2>
          <p className="text-ink-soft">Adding, changing or removing a tool saves a new profile version; a new description alone does not.</p>
          <div className={`grid items-start gap-6 ${editable ? 'lg:grid-cols-[3fr_2fr]' : ''}`}>
            {machine.tools.length === 0 ? (
              <Notice tone="note" title="No tools yet." role="status">
                {editable ? 'Add the first one with the form.' : archived ? 'It was archived without tools.' : `${whoMay('machines:write', true)} can add tools.`}
              </Notice>
            ) : (
              <DataTable
                caption={`Tools of ${machine.name}`}
                rows={machine.tools}
                rowKey={(t) => t.id}
                columns={[
                  { key: 'number', header: 'Tool', numeric: true, cell: (t) => `T${t.number}` },
                  { key: 'diameter', header: `Diameter (${unitSymbol('length', unit)})`, numeric: true, cell: (t) => formatLength(t.diameterMm, unit) },
                  { key: 'flutes', header: 'Flutes', numeric: true, cell: (t) => t.flutes },
                  { key: 'kind', header: 'Kind', cell: (t) => TOOL_KIND_LABELS[t.kind] },
                  { key: 'description', header: 'Description', cell: (t) => t.description || '—' },
                  ...(editable
                    ? [
                        {
                          key: 'edit',
                          header: 'Change',
                          cell: (t: (typeof machine.tools)[number]) => (
                            <Link href={`/machines/${machine.id}/tools/${t.id}`} className="font-bold text-spruce underline underline-offset-4">
                              Edit<span className="sr-only"> tool {t.number}</span>
                            </Link>
                          ),
                        },
                      ]
                    : []),
                ]}
              />
            )}
            {editable ? <ToolForm machineId={machine.id} unit={unit} nextNumber={nextNumber} action={addToolAction} /> : null}
          </div>
        </section>

        <section aria-labelledby="versions-title" className="flex flex-col gap-3">
          <h2 id="versions-title">Versions</h2>
          <VersionsTable versions={versions} current={machine.version} unit={unit} />
        </section>
        <CalibrationSection user={user} machineId={machine.id} archived={archived} />

        {mayWrite && !archived ? (
          <section aria-labelledby="remove-title" className="flex flex-col gap-3">
            <h2 id="remove-title">Remove</h2>
            <ConfirmAction
              action={removeMachineAction}
              hidden={{ machineId: machine.id }}
              label="Remove machine"
              question={`Remove ${machine.name}? If estimates or jobs use it, it is archived instead: kept and readable, but no longer offered for new jobs.`}
              confirmLabel="Yes, remove"
            />
          </section>
        ) : null}
      </div>
    </>
  );
}
