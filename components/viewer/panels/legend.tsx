'use client';
// What the colours mean, in words, with the line style beside each (rapids dashed), and the
// markers' shapes. The colour choice itself is a labelled select.
import { COLOUR_MODE_LABELS, COLOUR_MODES, type ColourMode, type LegendEntry } from '@/lib/viewer/colour-map';
import { PATH_COLOURS } from '@/lib/viewer/palette';

function Swatch({ colour, dashed }: { colour: string; dashed: boolean }) {
  // an SVG line: fill and stroke are attributes, not style, so the CSP's no-inline-style rule holds
  return (
    <svg width="36" height="12" aria-hidden="true" className="shrink-0">
      <line x1="2" y1="6" x2="34" y2="6" stroke={colour} strokeWidth="4" strokeDasharray={dashed ? '6 5' : undefined} />
    </svg>
  );
}

export function Legend({ mode, entries, onMode }: { mode: ColourMode; entries: LegendEntry[]; onMode: (m: ColourMode) => void }) {
  return (
    <section aria-labelledby="legend-title" className="rounded-md border-2 border-night-line bg-night-raised p-3 text-white" data-testid="viewer-legend">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 id="legend-title" className="text-base font-bold">Legend</h3>
        <label className="flex items-center gap-2 text-sm">
          Colour by
          <select value={mode} onChange={(e) => onMode(e.target.value as ColourMode)} className="rounded border-2 border-night-edge bg-night px-2 py-1 text-white" data-testid="colour-mode">
            {COLOUR_MODES.map((m) => (
              <option key={m} value={m}>
                {COLOUR_MODE_LABELS[m]}
              </option>
            ))}
          </select>
        </label>
      </div>
      <ul className="mt-2 grid gap-1 text-sm sm:grid-cols-2">
        {entries.map((e) => (
          <li key={e.key} className="flex items-center gap-2" data-legend-key={e.key}>
            <Swatch colour={e.colour} dashed={e.dashed} />
            {e.words}
          </li>
        ))}
        <li className="flex items-center gap-2">
          <svg width="36" height="14" aria-hidden="true" className="shrink-0">
            <polygon points="11,2 25,2 18,13" fill={PATH_COLOURS.plunge} />
          </svg>
          Plunge point (cone)
        </li>
        <li className="flex items-center gap-2">
          <svg width="36" height="14" aria-hidden="true" className="shrink-0">
            <rect x="12" y="1" width="12" height="12" fill={PATH_COLOURS.tool} />
          </svg>
          Tool change (cube)
        </li>
        <li className="flex items-center gap-2">
          <svg width="36" height="14" aria-hidden="true" className="shrink-0">
            <circle cx="18" cy="7" r="5" fill="none" stroke={PATH_COLOURS.finding} strokeWidth="2.5" />
          </svg>
          Move on a finding’s line (ring)
        </li>
        <li className="flex items-center gap-2">
          <svg width="36" height="14" aria-hidden="true" className="shrink-0">
            <rect x="6" y="2" width="24" height="10" fill="none" stroke={PATH_COLOURS.part} strokeWidth="2" />
          </svg>
          Part, numbered in the order it comes free
        </li>
      </ul>
    </section>
  );
}
