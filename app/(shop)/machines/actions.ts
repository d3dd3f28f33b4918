'use server';
// Server actions of the machine pages: create and edit a profile, remove (or archive) and
// restore a machine, add, edit and remove tools, and the shop's length unit. Each starts
// with the same guard as the route handlers and calls the same queries; inputs arrive in
// mm and minor units (the forms convert) and are judged by the same schemas.
import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { addTool, removeMachine, removeTool, updateMachine, updateTool } from '@/db/queries/machine-changes';
import { createMachine } from '@/db/queries/machines';
import { setLengthUnit } from '@/db/queries/shops';
import { requireAction } from '@/lib/auth/require-role';
import { runAction, type ActionState } from '@/lib/http/action-state';
import { flatToProfileInput } from '@/lib/machines/profile-fields';
import { formDataToObject, parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { machinePatchSchema, parseMachineCreate, parseProfileOrThrow, shopSettingsSchema, toolInputSchema, toolPatchSchema } from '@/lib/validation/machines';
import { LENGTH_UNIT_LABELS } from '@/lib/units/length';

/** A number typed as text becomes a number; anything else stays as typed, for zod to name. */
function numberOrText(text: string | undefined): unknown {
  if (text === undefined) return undefined;
  return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(text.trim()) ? Number(text) : text;
}

export async function saveMachineAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  let goTo: string | null = null;
  const state = await runAction(async () => {
    const user = await requireAction('machines:write');
    const flat = formDataToObject(form);
    const { tools: _none, ...profile } = flatToProfileInput(flat, []);
    void _none;
    // an empty vacuum field clears the level (null): the machine has no vacuum table, or it was never measured
    const vacuum = flat.defaultVacuumKpa === undefined ? undefined : flat.defaultVacuumKpa.trim() === '' ? null : numberOrText(flat.defaultVacuumKpa);
    const settings = { hourlyRateMinor: numberOrText(flat.hourlyRateMinor), defaultHoldDown: flat.defaultHoldDown, defaultVacuumKpa: vacuum };
    if (!flat.machineId) {
      const input = parseMachineCreate({ ...profile, ...settings });
      const machine = await createMachine(user.shopId, input.profile, input.settings);
      revalidatePath('/machines');
      goTo = `/machines/${machine.id}?saved=created&v=1`;
      return `${machine.name} added as version 1.`;
    }
    const machineId = parseId(flat.machineId, 'machine');
    const patch = parseProfileOrThrow(machinePatchSchema, { ...profile, ...settings }, 'machine');
    const saved = await updateMachine(user.shopId, machineId, patch);
    revalidatePath('/machines');
    revalidatePath(`/machines/${machineId}`);
    goTo = `/machines/${machineId}?saved=${saved.versioned ? 'version' : 'same'}&v=${saved.version}`;
    return saved.versioned ? `Saved as version ${saved.version}.` : 'Saved. No profile field changed, so the version stays the same.';
  });
  if (state.status === 'ok' && goTo) redirect(goTo);
  return state;
}

export async function removeMachineAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  let goTo: string | null = null;
  const state = await runAction(async () => {
    const user = await requireAction('machines:write');
    const machineId = parseId(String(form.get('machineId') ?? ''), 'machine');
    const result = await removeMachine(user.shopId, machineId);
    revalidatePath('/machines');
    revalidatePath(`/machines/${machineId}`);
    if (result === 'deleted') goTo = '/machines?removed=1';
    return result === 'archived'
      ? 'Archived: estimates or jobs use this machine, so it is kept and stays readable. It is no longer offered for new jobs.'
      : 'Machine removed.';
  });
  if (state.status === 'ok' && goTo) redirect(goTo);
  return state;
}

export async function restoreMachineAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const user = await requireAction('machines:write');
    const machineId = parseId(String(form.get('machineId') ?? ''), 'machine');
    const saved = await updateMachine(user.shopId, machineId, { archived: false });
    revalidatePath('/machines');
    revalidatePath(`/machines/${machineId}`);
    return `${saved.machine.name} is restored and offered for new jobs again.`;
  });
}

function toolInput(flat: Record<string, string | undefined>) {
  return {
    number: numberOrText(flat.number),
    diameterMm: numberOrText(flat.diameterMm),
    flutes: numberOrText(flat.flutes),
    kind: flat.kind,
    description: flat.description ?? '',
  };
}

export async function addToolAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const user = await requireAction('machines:write');
    const flat = formDataToObject(form);
    const machineId = parseId(String(flat.machineId ?? ''), 'machine');
    const input = parseProfileOrThrow(toolInputSchema, toolInput(flat), 'tool');
    const saved = await addTool(user.shopId, machineId, input);
    revalidatePath(`/machines/${machineId}`);
    revalidatePath('/machines');
    return `Tool ${input.number} added; the profile is now version ${saved.version}.`;
  });
}

export async function updateToolAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  let goTo: string | null = null;
  const state = await runAction(async () => {
    const user = await requireAction('machines:write');
    const flat = formDataToObject(form);
    const machineId = parseId(String(flat.machineId ?? ''), 'machine');
    const toolId = parseId(String(flat.toolId ?? ''), 'tool');
    const patch = parseProfileOrThrow(toolPatchSchema, toolInput(flat), 'tool');
    const saved = await updateTool(user.shopId, machineId, toolId, patch);
    revalidatePath(`/machines/${machineId}`);
    goTo = `/machines/${machineId}?saved=${saved.versioned ? 'tool-version' : 'tool-same'}&v=${saved.version}`;
    return saved.versioned ? `Tool saved; the profile is now version ${saved.version}.` : 'Tool saved. Only the description changed, so the version stays the same.';
  });
  if (state.status === 'ok' && goTo) redirect(goTo);
  return state;
}

export async function removeToolAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  let goTo: string | null = null;
  const state = await runAction(async () => {
    const user = await requireAction('machines:write');
    const machineId = parseId(String(form.get('machineId') ?? ''), 'machine');
    const toolId = parseId(String(form.get('toolId') ?? ''), 'tool');
    const saved = await removeTool(user.shopId, machineId, toolId);
    revalidatePath(`/machines/${machineId}`);
    revalidatePath('/machines');
    goTo = `/machines/${machineId}?saved=tool-removed&v=${saved.version}`;
    return `Tool removed; the profile is now version ${saved.version}.`;
  });
  if (state.status === 'ok' && goTo) redirect(goTo);
  return state;
}

export async function setLengthUnitAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const user = await requireAction('shop:write');
    const { lengthUnit } = parseOrThrow(shopSettingsSchema, formDataToObject(form), 'shop');
    await setLengthUnit(user.shopId, lengthUnit);
    revalidatePath('/', 'layout');
    return `Lengths are now shown in ${LENGTH_UNIT_LABELS[lengthUnit].toLowerCase()}. Stored values stay in mm.`;
  });
}
