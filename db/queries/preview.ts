import 'server-only';
// What the preview page offers: the shop's machines in use, each with its profile as the
// estimator reads it (tools included) and its hold-down defaults, and the shop's materials as
// sheet presets. Read only; nothing is stored by a preview.
import { listMaterials } from './materials';
import { getMachine, listMachines, machineRowToProfile } from './machines';
import type { HoldDown } from '@/lib/validation/enums';
import type { MachineProfile } from '@/lib/validation/machine-profile';

export interface PreviewMachine {
  id: number;
  name: string;
  profile: MachineProfile;
  defaultHoldDown: HoldDown;
  defaultVacuumKpa: number | null;
}

export interface PreviewSheet {
  id: number;
  name: string;
  widthMm: number;
  lengthMm: number;
  thicknessMm: number;
}

export async function previewChoices(shopId: number): Promise<{ machines: PreviewMachine[]; sheets: PreviewSheet[] }> {
  const [summaries, materials] = await Promise.all([listMachines(shopId), listMaterials(shopId)]);
  const machines: PreviewMachine[] = [];
  for (const s of summaries) {
    const m = await getMachine(shopId, s.id);
    if (!m) continue;
    machines.push({ id: m.id, name: m.name, profile: machineRowToProfile(m, m.tools), defaultHoldDown: m.defaultHoldDown, defaultVacuumKpa: m.defaultVacuumKpa });
  }
  const sheets = materials.map((m) => ({ id: m.id, name: m.name, widthMm: m.sheetWidthMm, lengthMm: m.sheetLengthMm, thicknessMm: m.thicknessMm }));
  return { machines, sheets };
}
