// Property tests (fast-check): random valid programs never throw and give no errors; the move
// count and total length do not depend on comments, blank lines, letter case, spacing, N
// numbers or line endings; random garbage gives diagnostics, never exceptions or hangs.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DIAGNOSTIC_CODES, interpret, moveLength } from '@/lib/gcode';

type Op =
  | { k: 'G0' | 'G1'; x: number; y: number; z: number }
  | { k: 'arc'; ccw: boolean; r: number; a0: number; sweep: number; dz: number; useR: boolean }
  | { k: 'drill'; code: 'G81' | 'G82' | 'G83'; x: number; y: number; depth: number; q: number }
  | { k: 'dwell'; p: number }
  | { k: 'tool'; t: number; s: number };

const coord = fc.integer({ min: -5000, max: 5000 }).map((v) => v / 10);
const op: fc.Arbitrary<Op> = fc.oneof(
  { weight: 5, arbitrary: fc.record({ k: fc.constantFrom('G0' as const, 'G1' as const), x: coord, y: coord, z: coord }) },
  {
    weight: 3,
    arbitrary: fc.record({
      k: fc.constant('arc' as const),
      ccw: fc.boolean(),
      r: fc.integer({ min: 10, max: 2000 }).map((v) => v / 10),
      a0: fc.integer({ min: 0, max: 359 }),
      sweep: fc.integer({ min: 5, max: 355 }),
      dz: fc.integer({ min: -50, max: 50 }).map((v) => v / 10),
      useR: fc.boolean(),
    }),
  },
  { weight: 1, arbitrary: fc.record({ k: fc.constant('drill' as const), code: fc.constantFrom('G81' as const, 'G82' as const, 'G83' as const), x: coord, y: coord, depth: fc.integer({ min: 1, max: 300 }).map((v) => v / 10), q: fc.integer({ min: 5, max: 100 }).map((v) => v / 10) }) },
  { weight: 1, arbitrary: fc.record({ k: fc.constant('dwell' as const), p: fc.integer({ min: 0, max: 50 }).map((v) => v / 10) }) },
  { weight: 1, arbitrary: fc.record({ k: fc.constant('tool' as const), t: fc.integer({ min: 1, max: 20 }), s: fc.integer({ min: 6000, max: 24000 }) }) },
);

const f4 = (v: number) => (Math.round(v * 1e4) / 1e4).toFixed(4);

type Xyz = [number, number, number];

/** the program as lists of words per line (canonical form), tracking the current point */
function blocks(ops: Op[]): string[][] {
  return program(ops).lines;
}

/**
 * The lines and, per line that moves, the point the generator tracked for its end: G0/G1 go
 * to their words, an arc to its end word, a G98 drill cycle ends over its hole at the higher
 * of the Z before it and R (NISTIR 6556 §3.5.20).
 */
function program(ops: Op[]): { lines: string[][]; ends: Array<Xyz | null> } {
  const out: string[][] = [['G21', 'G90', 'G17', 'G94'], ['F1200']];
  const ends: Array<Xyz | null> = [null, null];
  const mark = () => { while (ends.length < out.length) ends.push(null); ends[out.length - 1] = [x, y, z]; };
  let x = 0;
  let y = 0;
  let z = 0;
  for (const o of ops) {
    if (o.k === 'G0' || o.k === 'G1') {
      out.push([o.k, 'X' + f4(o.x), 'Y' + f4(o.y), 'Z' + f4(o.z)]);
      [x, y, z] = [o.x, o.y, o.z];
      mark();
    } else if (o.k === 'arc') {
      const a0 = (o.a0 * Math.PI) / 180;
      const sw = ((o.ccw ? 1 : -1) * o.sweep * Math.PI) / 180;
      const cx = x - o.r * Math.cos(a0);
      const cy = y - o.r * Math.sin(a0);
      const ex = Number(f4(cx + o.r * Math.cos(a0 + sw)));
      const ey = Number(f4(cy + o.r * Math.sin(a0 + sw)));
      const ez = Number(f4(z + o.dz));
      const chord = Math.hypot(ex - x, ey - y);
      const w = [o.ccw ? 'G3' : 'G2', 'X' + f4(ex), 'Y' + f4(ey), 'Z' + f4(ez)];
      if (o.useR && chord > 1 && Math.abs(o.sweep - 180) > 2) w.push('R' + f4(o.sweep > 180 ? -o.r : o.r));
      else w.push('I' + f4(cx - x), 'J' + f4(cy - y));
      out.push(w);
      [x, y, z] = [ex, ey, ez];
      mark();
    } else if (o.k === 'drill') {
      const rz = z + 2;
      const w = [o.code, 'G98', 'X' + f4(o.x), 'Y' + f4(o.y), 'Z' + f4(rz - o.depth), 'R' + f4(rz)];
      if (o.code === 'G83') w.push('Q' + f4(o.q));
      if (o.code === 'G82') w.push('P0.5');
      out.push(w);
      [x, y, z] = [o.x, o.y, Math.max(z, rz)];
      mark();
      out.push(['G80']);
    } else if (o.k === 'dwell') out.push(['G4', 'P' + o.p.toFixed(1)]);
    else if (o.k === 'tool') out.push(['T' + o.t, 'M6'], ['S' + o.s, 'M3']);
  }
  out.push(['M5'], ['M30']);
  while (ends.length < out.length) ends.push(null);
  return { lines: out, ends };
}

interface Style {
  comments: boolean;
  blank: boolean;
  lower: boolean;
  spacing: 0 | 1 | 2 | 3;
  numbers: boolean;
  crlf: boolean;
}
const style: fc.Arbitrary<Style> = fc.record({ comments: fc.boolean(), blank: fc.boolean(), lower: fc.boolean(), spacing: fc.constantFrom(0 as const, 1 as const, 2 as const, 3 as const), numbers: fc.boolean(), crlf: fc.boolean() });

function render(b: string[][], s: Style): string {
  const lines: string[] = [];
  b.forEach((words, k) => {
    let ws = words.map((w) => (s.spacing === 2 ? w[0] + ' ' + w.slice(1) : s.spacing === 3 ? w.split('').join(' ') : w));
    if (s.comments && k % 3 === 0) ws = [ws[0], '(stepdown pass)', ...ws.slice(1)];
    let line = ws.join(s.spacing === 0 ? '' : ' ');
    if (s.numbers) line = `N${(k + 1) * 5} ${line}`;
    if (s.lower) line = line.toLowerCase();
    if (s.comments && k % 4 === 1) line += ' ; Alder & Finch bracket';
    lines.push(line);
    if (s.blank && k % 5 === 2) lines.push('', '   ');
    if (s.comments && k % 7 === 3) lines.push('(tab on the last pass)');
  });
  return lines.join(s.crlf ? '\r\n' : '\n');
}

function measure(text: string): { count: number; length: number; errors: string[] } {
  const r = interpret(text);
  let length = 0;
  for (let i = 0; i < r.moves.count; i++) length += moveLength(r.moves, i);
  return { count: r.moves.count, length, errors: r.diagnostics.filter((d) => d.severity === 'error').map((d) => `${d.code}: ${d.text}`) };
}

describe('random valid programs', () => {
  it('never throw and give no errors', () => {
    fc.assert(
      fc.property(fc.array(op, { maxLength: 40 }), (ops) => {
        expect(measure(render(blocks(ops), { comments: false, blank: false, lower: false, spacing: 1, numbers: false, crlf: false })).errors).toEqual([]);
      }),
      { numRuns: 400 },
    );
  });

  it('every line that moves ends at the point the generator tracked', () => {
    let checked = 0;
    let runs = 0;
    fc.assert(
      fc.property(fc.array(op, { minLength: 1, maxLength: 40 }), (ops) => {
        runs++;
        const { lines, ends } = program(ops);
        const r = interpret(render(lines, { comments: false, blank: false, lower: false, spacing: 1, numbers: false, crlf: false }));
        const m = r.moves;
        // the last record of each source line (plain rendering: line k + 1 is lines[k])
        const lastOfLine = new Map<number, number>();
        for (let i = 0; i < m.count; i++) lastOfLine.set(m.line[i], i);
        ends.forEach((want, k) => {
          if (!want) return;
          const i = lastOfLine.get(k + 1);
          expect(i, `line ${k + 1}: ${lines[k].join(' ')}`).toBeDefined();
          // words are written to 4 decimals, so 1e-6 mm is far below any rounding of the text
          expect(Math.abs(m.x[i!] - want[0])).toBeLessThan(1e-6);
          expect(Math.abs(m.y[i!] - want[1])).toBeLessThan(1e-6);
          expect(Math.abs(m.z[i!] - want[2])).toBeLessThan(1e-6);
          checked++;
        });
      }),
      { numRuns: 300 },
    );
    // 300 programs of 1–40 operations, 9 in 11 of them moves (by weight): thousands of end points
    expect(runs).toBe(300);
    expect(checked).toBeGreaterThan(1000);
  });

  it('move count and total length are invariant to comments, blank lines, case, spacing, N numbers, CRLF', () => {
    fc.assert(
      fc.property(fc.array(op, { maxLength: 40 }), style, (ops, s) => {
        const b = blocks(ops);
        const plain = measure(render(b, { comments: false, blank: false, lower: false, spacing: 1, numbers: false, crlf: false }));
        const styled = measure(render(b, s));
        expect(styled.count).toBe(plain.count);
        expect(styled.length).toBe(plain.length);
        expect(styled.errors).toEqual([]);
      }),
      { numRuns: 400 },
    );
  });

  it('the fast tokenizer and parseLine on every line give the same move list', () => {
    fc.assert(
      fc.property(fc.array(op, { maxLength: 30 }), style, (ops, s) => {
        const text = render(blocks(ops), s);
        const a = interpret(text);
        const b = interpret(text, { tokenizer: 'parser' });
        expect(b.moves).toEqual(a.moves);
        expect(b.diagnostics).toEqual(a.diagnostics);
      }),
      { numRuns: 200 },
    );
  });
});

describe('random garbage', () => {
  it('any text: no exception, every diagnostic well formed and on a real line', () => {
    let errorTexts = 0;
    let diagnostics = 0;
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'binary', maxLength: 40 }).map((t) => t.replace(/\n/g, ' ')), { maxLength: 30 }), (lines) => {
        const text = lines.join('\n');
        const r = interpret(text);
        // a CR inside a generated line ends a line too (NISTIR 6556 §3.3: CR, LF or both)
        const asRead = text.split(/\r\n|\r|\n/);
        for (const d of r.diagnostics) {
          diagnostics++;
          expect(DIAGNOSTIC_CODES).toHaveProperty(d.code);
          expect(d.line).toBeGreaterThanOrEqual(0);
          expect(d.line).toBeLessThanOrEqual(r.facts.lineCount);
          expect(d.message.length).toBeGreaterThan(0);
          if (d.severity === 'error') {
            expect(d.text).toBe(asRead[d.line - 1]);
            errorTexts++;
          }
        }
      }),
      { numRuns: 500 },
    );
    // random code units seldom form words: about 60 diagnostics in 500 programs, a third of them
    // errors whose line text is compared (a bad number, a letter without a value)
    expect(diagnostics).toBeGreaterThanOrEqual(20);
    expect(errorTexts).toBeGreaterThanOrEqual(5);
  });

  it('a line of symbols that are neither words nor comments always gets a diagnostic on its line', () => {
    const junk = fc.string({ unit: fc.constantFrom(...'#[]$%&*=!?<>{}@~^`|\\"\',:)'.split('')), minLength: 1, maxLength: 12 }).filter((s) => s.trim() !== '%');
    fc.assert(
      fc.property(junk, (line) => {
        const r = interpret(`G21 F100\nG1 X1\n${line}\nM2`);
        expect(r.diagnostics.some((d) => d.line === 3)).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it('garbage letters and numbers mixed with real code never hang: 20,000 random lines finish', () => {
    const lines = fc.sample(fc.string({ unit: fc.constantFrom(...'GXYZIJKRFMgx0123456789.-+ ()#[;'.split('')), maxLength: 30 }), { numRuns: 20_000, seed: 7 });
    const t = performance.now();
    const r = interpret(lines.join('\n'));
    expect(r.facts.lineCount).toBe(20_000);
    expect(r.diagnostics.length).toBeGreaterThan(0);
    expect(performance.now() - t).toBeLessThan(30_000); // a hang guard, not a speed target
  });
});
