// Colour by move kind, by tool or by achieved speed: one colour per move written to the end
// vertex of each of its segments (a Uint8 RGB buffer the GPU reads as normalised colour, flat
// across each segment of the strip, path-build.ts),
// and the legend in words for the same choice. Pure, so the mapping is unit-tested.
import { hexToRgb, PATH_COLOURS, SPEED_COLOURS, TOOL_COLOURS, type Rgb } from './palette';
import { ViewKind, type ViewKindCode } from './path-kinds';

export const COLOUR_MODES = ['kind', 'tool', 'speed'] as const;
export type ColourMode = (typeof COLOUR_MODES)[number];
export const COLOUR_MODE_LABELS: Record<ColourMode, string> = { kind: 'Move kind', tool: 'Tool', speed: 'Achieved speed' };

export interface LegendEntry {
  key: string;
  words: string;
  colour: string;
  /** drawn dashed in the scene */
  dashed: boolean;
}

export const KIND_WORDS: Record<ViewKindCode, string> = {
  [ViewKind.rapid]: 'Rapid (dashed)',
  [ViewKind.cut]: 'Cut',
  [ViewKind.plunge]: 'Plunge',
  [ViewKind.air]: 'Air move (feed above the stock)',
  [ViewKind.still]: 'No motion',
};

const KIND_HEX: Record<ViewKindCode, string> = {
  [ViewKind.rapid]: PATH_COLOURS.rapid,
  [ViewKind.cut]: PATH_COLOURS.cut,
  [ViewKind.plunge]: PATH_COLOURS.plunge,
  [ViewKind.air]: PATH_COLOURS.air,
  [ViewKind.still]: PATH_COLOURS.still,
};

/** upper bounds of the speed steps, as shares of the commanded feed */
export const SPEED_STEPS = [0.2, 0.4, 0.6, 0.8, 1] as const;

/** the step of a share: 0 (under 20%) … 4 (80% and over); rapids and records have none (−1) */
export function speedStep(share: number): number {
  if (!(share >= 0)) return -1;
  for (let i = 0; i < SPEED_STEPS.length - 1; i++) if (share < SPEED_STEPS[i]) return i;
  return SPEED_STEPS.length - 1;
}

export function toolColour(slot: number): string {
  return TOOL_COLOURS[slot % TOOL_COLOURS.length];
}

export interface ColourInput {
  viewKind: Uint8Array;
  speedShare: Float32Array;
  /** per move: its tool slot */
  toolSlot: Uint8Array;
  moveSegStart: Uint32Array;
}

/** the colour of move i in this mode */
export function moveColour(input: ColourInput, mode: ColourMode, i: number): string {
  const kind = input.viewKind[i] as ViewKindCode;
  if (mode === 'kind' || kind === ViewKind.still) return KIND_HEX[kind];
  if (mode === 'tool') return toolColour(input.toolSlot[i]);
  const step = speedStep(input.speedShare[i]);
  return step < 0 ? KIND_HEX[kind] : SPEED_COLOURS[step];
}

/** writes the colour (RGB, 0–255) of the segment ending at each vertex of the strip into out
 *  (3 bytes per vertex; the first vertex takes the first segment's) */
export function colourPath(input: ColourInput, mode: ColourMode, out: Uint8Array): Uint8Array {
  const n = input.viewKind.length;
  const cache = new Map<string, Rgb>();
  let first = true;
  for (let i = 0; i < n; i++) {
    const from = input.moveSegStart[i];
    const to = input.moveSegStart[i + 1];
    if (from === to) continue;
    const hex = moveColour(input, mode, i);
    let rgb = cache.get(hex);
    if (!rgb) {
      rgb = hexToRgb(hex);
      cache.set(hex, rgb);
    }
    if (first) {
      out[0] = rgb[0];
      out[1] = rgb[1];
      out[2] = rgb[2];
      first = false;
    }
    for (let s = from; s < to; s++) {
      const o = (s + 1) * 3;
      out[o] = rgb[0];
      out[o + 1] = rgb[1];
      out[o + 2] = rgb[2];
    }
  }
  return out;
}

/** what each colour means, in words; kinds and tools only as the program has them */
export function legendFor(mode: ColourMode, present: { kinds: ReadonlySet<number>; tools: readonly number[] }): LegendEntry[] {
  const rapid: LegendEntry = { key: 'rapid', words: KIND_WORDS[ViewKind.rapid], colour: PATH_COLOURS.rapid, dashed: true };
  if (mode === 'kind') {
    return [ViewKind.cut, ViewKind.plunge, ViewKind.air, ViewKind.rapid]
      .filter((k) => present.kinds.has(k))
      .map((k) => ({ key: `kind-${k}`, words: KIND_WORDS[k], colour: KIND_HEX[k], dashed: k === ViewKind.rapid }));
  }
  const rapids = present.kinds.has(ViewKind.rapid) ? [rapid] : [];
  if (mode === 'tool') {
    return [...present.tools.map((t, slot) => ({ key: `tool-${t}`, words: `Tool ${t}`, colour: toolColour(slot), dashed: false })), ...rapids];
  }
  const steps = SPEED_STEPS.map((upper, i) => {
    const lower = i === 0 ? 0 : SPEED_STEPS[i - 1];
    const words = i === SPEED_STEPS.length - 1 ? `${Math.round(lower * 100)}–100% of the programmed feed` : `${Math.round(lower * 100)}–${Math.round(upper * 100)}% of the programmed feed`;
    return { key: `speed-${i}`, words, colour: SPEED_COLOURS[i], dashed: false };
  });
  return [...steps, ...rapids];
}

/** the kinds a path has, for the legend */
export function kindsPresent(viewKind: Uint8Array): Set<number> {
  const seen = new Set<number>();
  for (let i = 0; i < viewKind.length && seen.size < 5; i++) seen.add(viewKind[i]);
  return seen;
}
