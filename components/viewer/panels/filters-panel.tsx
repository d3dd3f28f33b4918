'use client';
// What the path shows: rapids on or off, tools one by one, a depth range (Z from, Z to) that
// clips the path, only the moves on findings' lines, and whether those are marked.
import type { LengthUnit } from '@/lib/units/length';
import { fromMm, toMm } from '@/lib/units/length';

export interface FilterState {
  showRapids: boolean;
  hiddenTools: ReadonlySet<number>;
  zRange: [number, number];
  onlyFindings: boolean;
  markFindings: boolean;
}

export function FiltersPanel({ value, onChange, tools, zLimits, unit }: { value: FilterState; onChange: (v: FilterState) => void; tools: number[]; zLimits: [number, number]; unit: LengthUnit }) {
  const step = unit === 'mm' ? 0.1 : 0.005;
  const z = (mm: number) => Number(fromMm(mm, unit).toFixed(unit === 'mm' ? 2 : 4));
  const sym = unit === 'mm' ? 'mm' : 'in';
  const toggleTool = (t: number) => {
    const next = new Set(value.hiddenTools);
    if (next.has(t)) next.delete(t);
    else next.add(t);
    onChange({ ...value, hiddenTools: next });
  };
  return (
    <fieldset className="rounded-md border-2 border-night-line bg-night-raised p-3 text-sm text-white" data-testid="viewer-filters">
      <legend className="px-1 text-base font-bold">Show</legend>
      <div className="flex flex-wrap gap-x-5 gap-y-2">
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={value.showRapids} onChange={(e) => onChange({ ...value, showRapids: e.target.checked })} data-testid="show-rapids" />
          Rapids
        </label>
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={value.onlyFindings} onChange={(e) => onChange({ ...value, onlyFindings: e.target.checked })} />
          Only moves with findings
        </label>
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={value.markFindings} onChange={(e) => onChange({ ...value, markFindings: e.target.checked })} />
          Mark findings
        </label>
        {tools.map((t) => (
          <label key={t} className="flex items-center gap-2">
            <input type="checkbox" checked={!value.hiddenTools.has(t)} onChange={() => toggleTool(t)} />
            Tool {t}
          </label>
        ))}
      </div>
      <div className="mt-2 flex flex-wrap items-center gap-4">
        <label className="flex items-center gap-2">
          Z from ({sym})
          <input
            type="range"
            min={z(zLimits[0])}
            max={z(zLimits[1])}
            step={step}
            value={z(value.zRange[0])}
            onChange={(e) => onChange({ ...value, zRange: [Math.min(toMm(Number(e.target.value), unit), value.zRange[1]), value.zRange[1]] })}
            aria-valuetext={`${z(value.zRange[0])} ${sym}`}
            className="accent-white"
          />
          <span className="figure w-20">{z(value.zRange[0])}</span>
        </label>
        <label className="flex items-center gap-2">
          Z to ({sym})
          <input
            type="range"
            min={z(zLimits[0])}
            max={z(zLimits[1])}
            step={step}
            value={z(value.zRange[1])}
            onChange={(e) => onChange({ ...value, zRange: [value.zRange[0], Math.max(toMm(Number(e.target.value), unit), value.zRange[0])] })}
            aria-valuetext={`${z(value.zRange[1])} ${sym}`}
            className="accent-white"
          />
          <span className="figure w-20">{z(value.zRange[1])}</span>
        </label>
      </div>
    </fieldset>
  );
}
