// The palette in tailwind.config.ts against WCAG 2.1's contrast minimums, for the
// pairings the pages actually use: body text on its background at 4.5:1 or more
// (SC 1.4.3 Contrast (Minimum)), and the border of a control, or any shape that has to
// be seen to use the page, at 3:1 or more against what is next to it (SC 1.4.11
// Non-text Contrast). The ratio is WCAG 2.x's: relative luminance from sRGB,
// (L1 + 0.05) / (L2 + 0.05).
import { describe, expect, it } from 'vitest';
import config from '@/tailwind.config';

type Shades = Record<string, string>;
const colors = config.theme?.colors as Record<string, string | Shades>;

/** A token as Tailwind names it in a class: `ink`, `ink-soft`, `night-edge`. */
function hex(token: string): string {
  const direct = colors[token];
  if (typeof direct === 'string') return direct;
  if (direct) return direct.DEFAULT;
  const cut = token.lastIndexOf('-');
  const shades = colors[token.slice(0, cut)];
  const value = typeof shades === 'object' ? shades[token.slice(cut + 1)] : undefined;
  if (!value) throw new Error(`No colour token ${token} in tailwind.config.ts`);
  return value;
}

// WCAG 2.1, definition of "relative luminance". The threshold is the sRGB standard's
// 0.04045 (WCAG's text said 0.03928 before May 2021; W3C notes it makes no practical
// difference, and for 8-bit channels none at all: no n/255 lies between the two).
function channel(value8bit: number): number {
  const c = value8bit / 255;
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

function relativeLuminance(colour: string): number {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(colour);
  if (!m) throw new Error(`Not a #rrggbb colour: ${colour}`);
  const [r, g, b] = m.slice(1).map((h) => channel(parseInt(h, 16)));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.1, definition of "contrast ratio". */
function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('the contrast formula', () => {
  it('gives the end points the WCAG definition states: 21:1 for black on white, 1:1 for a colour on itself', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 10);
    expect(contrastRatio('#767d86', '#767d86')).toBe(1);
  });

  it('agrees with values published by contrast checkers (from memory, checked against a stored guide)', () => {
    // #767676 on white, 4.54:1, the lightest grey that passes AA; #999999 on white, 2.85:1
    expect(contrastRatio('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
    expect(contrastRatio('#999999', '#ffffff')).toBeCloseTo(2.85, 2);
    // order does not matter
    expect(contrastRatio('#ffffff', '#767676')).toBe(contrastRatio('#767676', '#ffffff'));
  });
});

const TONES = ['ok', 'note', 'caution', 'fault'] as const;

// [text, background, where it is used]
const TEXT_PAIRS: [string, string, string][] = [
  ['ink', 'ground', 'page text'],
  ['ink', 'panel', 'forms and tables'],
  ['ink-soft', 'ground', 'page leads, hints'],
  ['ink-soft', 'panel', 'hints, draft status'],
  ['ink-faint', 'ground', 'cancelled status'],
  ['ink-faint', 'panel', 'captions'],
  ['white', 'spruce', 'primary button'],
  ['white', 'spruce-dark', 'primary button, hovered'],
  ['spruce', 'panel', 'links, product name on the sign-in card'],
  ['spruce', 'ground', 'links on the error pages'],
  ['white', 'night', 'navigation bar, table heads'],
  ['white', 'night-raised', 'sign-out button, hovered'],
  ['rule-light', 'night', 'navigation links not current'],
  ['ink', 'spruce-light', 'upload drop area while files are dragged over it'],
  ...TONES.flatMap((t): [string, string, string][] => [
    [t, `${t}-tint`, `${t} status and message on its tint`],
    [t, 'panel', `${t} words on a form or table row`],
    [t, 'ground', `${t} words on a striped table row`],
    ['ink', `${t}-tint`, `message body inside a ${t} box`],
  ]),
];

// [border or shape, what is next to it, where it is used]
const BORDER_PAIRS: [string, string, string][] = [
  ['rule', 'ground', 'inputs, secondary buttons and card edges on the page'],
  ['rule', 'panel', 'inputs and secondary buttons inside a card'],
  ['night-edge', 'night', 'sign-out button on the bar'],
  ['night-edge', 'night-raised', 'sign-out button, hovered'],
  ['spruce', 'ground', 'primary button'],
  ['spruce', 'panel', 'primary button in a card'],
  ['fault', 'panel', 'danger button, field in error'],
  ['ink', 'ground', 'focus ring'],
  ['ink', 'panel', 'focus ring'],
  ['spruce-light', 'night', 'focus ring and current-page bar on the navigation bar'],
  ['spruce', 'spruce-light', 'edge of the upload drop area while files are dragged over it'],
  ['note', 'ground', 'fill of a progress bar on its track (upload, estimate)'],
  ...TONES.flatMap((t): [string, string, string][] => [
    [t, 'ground', `edge of a ${t} box on the page`],
    [t, 'panel', `edge of a ${t} box in a card`],
  ]),
];

describe('palette of tailwind.config.ts', () => {
  it.each(TEXT_PAIRS)('text %s on %s (%s) reaches 4.5:1, WCAG 2.1 SC 1.4.3', (fg, bg) => {
    expect(contrastRatio(hex(fg), hex(bg))).toBeGreaterThanOrEqual(4.5);
  });

  it.each(BORDER_PAIRS)('border %s against %s (%s) reaches 3:1, WCAG 2.1 SC 1.4.11', (fg, bg) => {
    expect(contrastRatio(hex(fg), hex(bg))).toBeGreaterThanOrEqual(3);
  });

  it('has the neutral tone names and none of the run-state ones', () => {
    for (const t of TONES) expect(typeof colors[t]).toBe('object');
    for (const old of ['go', 'hold', 'stop', 'info']) expect(colors[old]).toBeUndefined();
  });
});
