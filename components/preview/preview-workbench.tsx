'use client';
// The preview: a local program file (dropped, or picked with the file input) shown in the 3D
// viewer with a chosen machine, sheet, Z zero and hold-down, without uploading anything: the
// file is read by the browser's worker only.
import { useMemo, useState } from 'react';
import { Button } from '@/components/ui/button';
import { InputField, SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ProgramViewer } from '@/components/viewer/program-viewer';
import type { PreviewMachine, PreviewSheet } from '@/db/queries/preview';
import { HOLD_DOWN_LABELS, HOLD_DOWNS, type HoldDown } from '@/lib/validation/enums';
import type { ViewerInput } from '@/lib/viewer/view-run';

interface Settings {
  machineId: string;
  widthMm: string;
  lengthMm: string;
  thicknessMm: string;
  zero: 'top' | 'table';
  hold: HoldDown | 'none';
  vacuumKpa: string;
}

type Errors = Partial<Record<keyof Settings, string[]>>;

/** the settings as the engine's job, or the field errors */
export function settingsToInput(s: Settings, machines: PreviewMachine[], name: string): { input: ViewerInput } | { errors: Errors } {
  const errors: Errors = {};
  const machine = machines.find((m) => String(m.id) === s.machineId);
  if (!machine) errors.machineId = ['Choose a machine.'];
  const num = (key: 'widthMm' | 'lengthMm' | 'thicknessMm' | 'vacuumKpa', what: string, max: number) => {
    const v = Number(s[key]);
    if (s[key].trim() === '' || !Number.isFinite(v) || v <= 0 || v > max) {
      errors[key] = [`Give the ${what} as a number above 0 and at most ${max.toLocaleString('en')}.`];
      return 0;
    }
    return v;
  };
  const widthMm = num('widthMm', 'sheet width in mm', 10_000);
  const lengthMm = num('lengthMm', 'sheet length in mm', 10_000);
  const thicknessMm = num('thicknessMm', 'sheet thickness in mm', 500);
  const vacuumKpa = s.hold === 'vacuum' ? num('vacuumKpa', 'vacuum level in kPa', 101) : null;
  if (Object.keys(errors).length > 0 || !machine) return { errors };
  return {
    input: {
      name,
      profile: machine.profile,
      job: { sheet: { widthMm, lengthMm, thicknessMm }, zero: s.zero, hold: s.hold === 'none' ? null : s.hold, vacuumKpa },
    },
  };
}

export function PreviewWorkbench({ machines, sheets }: { machines: PreviewMachine[]; sheets: PreviewSheet[] }) {
  const first = machines[0];
  const sheet = sheets[0];
  const [settings, setSettings] = useState<Settings>({
    machineId: first ? String(first.id) : '',
    widthMm: String(sheet?.widthMm ?? 1220),
    lengthMm: String(sheet?.lengthMm ?? 2440),
    thicknessMm: String(sheet?.thicknessMm ?? 18),
    zero: 'top',
    hold: first?.defaultHoldDown ?? 'none',
    vacuumKpa: String(first?.defaultVacuumKpa ?? 20),
  });
  const [errors, setErrors] = useState<Errors>({});
  const [file, setFile] = useState<File | null>(null);
  const [input, setInput] = useState<ViewerInput | null>(null);
  const [dragging, setDragging] = useState(false);

  const set = (patch: Partial<Settings>) => setSettings((s) => ({ ...s, ...patch }));
  const show = (f: File | null, s: Settings) => {
    if (!f) return;
    const r = settingsToInput(s, machines, f.name);
    if ('errors' in r) {
      setErrors(r.errors);
      return;
    }
    setErrors({});
    setFile(f);
    setInput(r.input);
  };
  const sheetOptions = useMemo(() => [{ value: '', label: 'Type the size below' }, ...sheets.map((m) => ({ value: String(m.id), label: `${m.name} (${m.widthMm} × ${m.lengthMm} × ${m.thicknessMm} mm)` }))], [sheets]);

  if (machines.length === 0) {
    return (
      <Notice tone="caution" title="The shop has no machine yet." role="status">
        A preview plans the motion for a machine’s limits. An admin adds one on the machines page.
      </Notice>
    );
  }

  return (
    <div className="flex flex-col gap-6">
      <form
        className="grid gap-4 rounded-md border-2 border-rule bg-panel p-5 lg:grid-cols-[minmax(0,1.2fr)_minmax(0,2fr)]"
        onSubmit={(e) => {
          e.preventDefault();
          show(file, settings);
        }}
        noValidate
      >
        <div
          className={`flex flex-col justify-center gap-2 rounded-md border-4 border-dashed p-5 ${dragging ? 'border-spruce bg-spruce-light' : 'border-rule'}`}
          onDragOver={(e) => {
            e.preventDefault();
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={(e) => {
            e.preventDefault();
            setDragging(false);
            const f = e.dataTransfer.files[0];
            if (f) show(f, settings);
          }}
          data-testid="drop-zone"
        >
          <label htmlFor="preview-file" className="font-bold">
            Program file
          </label>
          <p className="text-sm text-ink-soft" id="preview-file-hint">
            Drop a G-code file here or pick one. It stays on this computer: nothing is uploaded.
          </p>
          <input
            id="preview-file"
            type="file"
            accept=".nc,.ngc,.tap,.gcode,.cnc,.txt"
            aria-describedby="preview-file-hint"
            onChange={(e) => show(e.target.files?.[0] ?? null, settings)}
            className="text-base"
            data-testid="preview-file"
          />
          {file ? <p className="break-all font-mono text-sm">{file.name}</p> : null}
        </div>
        <div className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
          <SelectField
            id="preview-machine"
            label="Machine"
            value={settings.machineId}
            errors={errors.machineId}
            options={machines.map((m) => ({ value: String(m.id), label: m.name }))}
            onChange={(e) => {
              const m = machines.find((x) => String(x.id) === e.target.value);
              set({ machineId: e.target.value, ...(m ? { hold: m.defaultHoldDown, vacuumKpa: String(m.defaultVacuumKpa ?? settings.vacuumKpa) } : {}) });
            }}
          />
          <SelectField
            id="preview-sheet"
            label="Sheet"
            defaultValue={sheet ? String(sheet.id) : ''}
            options={sheetOptions}
            onChange={(e) => {
              const m = sheets.find((x) => String(x.id) === e.target.value);
              if (m) set({ widthMm: String(m.widthMm), lengthMm: String(m.lengthMm), thicknessMm: String(m.thicknessMm) });
            }}
          />
          <InputField id="preview-width" label="Sheet X (mm)" inputMode="decimal" value={settings.widthMm} errors={errors.widthMm} onChange={(e) => set({ widthMm: e.target.value })} />
          <InputField id="preview-length" label="Sheet Y (mm)" inputMode="decimal" value={settings.lengthMm} errors={errors.lengthMm} onChange={(e) => set({ lengthMm: e.target.value })} />
          <InputField id="preview-thickness" label="Thickness (mm)" inputMode="decimal" value={settings.thicknessMm} errors={errors.thicknessMm} onChange={(e) => set({ thicknessMm: e.target.value })} />
          <SelectField
            id="preview-zero"
            label="Z zero"
            value={settings.zero}
            options={[
              { value: 'top', label: 'Top of stock' },
              { value: 'table', label: 'Table surface' },
            ]}
            onChange={(e) => set({ zero: e.target.value as Settings['zero'] })}
          />
          <SelectField
            id="preview-hold"
            label="Hold-down"
            value={settings.hold}
            options={[{ value: 'none', label: 'Not named (nothing holds a freed part)' }, ...HOLD_DOWNS.map((h) => ({ value: h, label: HOLD_DOWN_LABELS[h] }))]}
            onChange={(e) => set({ hold: e.target.value as Settings['hold'] })}
          />
          {settings.hold === 'vacuum' ? (
            <InputField id="preview-vacuum" label="Vacuum (kPa)" inputMode="decimal" value={settings.vacuumKpa} errors={errors.vacuumKpa} onChange={(e) => set({ vacuumKpa: e.target.value })} />
          ) : null}
          <div className="flex items-end">
            <Button type="submit" disabled={!file}>
              Show with these settings
            </Button>
          </div>
        </div>
      </form>
      {file && input ? (
        <ProgramViewer file={file} input={input} />
      ) : (
        <Notice tone="note" title="No program chosen yet." role="status">
          Choose a program file above to see its path over the sheet, its parts and its findings.
        </Notice>
      )}
    </div>
  );
}
