// The viewer's colours, our own (reasons in docs/style.md): chosen to read on the dark `night`
// ground of tailwind.config.ts, which spreads them in as the `path` colours so the legend's
// swatches and the scene use one list. Colour is never the only signal: rapids are also
// dashed, and every legend entry has words.
export const PATH_COLOURS = {
  cut: '#f2b66d', // apricot: material is being removed
  plunge: '#ff8fc1', // pink: going down into the stock
  air: '#8fb8de', // pale sky: feeding above the stock
  rapid: '#b9a3f5', // lilac, dashed: positioning at the machine's rapid rate
  still: '#8a939e', // a record with no motion
  finding: '#ff5470', // a move or part a finding names
  part: '#e8edf2', // part outline
  sheet: '#c8b48f', // birch-like sheet face
  spoilboard: '#3a4048',
  travel: '#6b7682',
  tool: '#ffffff',
  done: '#5c636c', // the path still to come, while playing
} as const;

/** tools in the order first used, cycling: eight hues of our own, far apart on the wheel */
export const TOOL_COLOURS = ['#f2b66d', '#7fd6c2', '#c9a0ff', '#ffd84d', '#ff8fa3', '#8fc1ff', '#b8e07a', '#f0a0dc'] as const;

/** achieved speed as a share of the commanded feed, slow to full: five steps of one ramp */
export const SPEED_COLOURS = ['#ff5c8a', '#ff9966', '#ffd166', '#b5e48c', '#7fd6ff'] as const;

export type Rgb = [number, number, number];

/** '#rrggbb' → [r, g, b] in 0–255 */
export function hexToRgb(hex: string): Rgb {
  const v = Number.parseInt(hex.slice(1), 16);
  return [(v >> 16) & 255, (v >> 8) & 255, v & 255];
}
