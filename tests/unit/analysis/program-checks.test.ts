// Program safety checks move by move: each kind on a small program with a known answer.
import { describe, expect, it } from 'vitest';
import { analyze, type AnalysisInput } from '@/lib/analysis';
import { interpret } from '@/lib/gcode';
import { ProgramWriter } from './support/program';
import { job } from './support/jobs';

const machine: NonNullable<AnalysisInput['machine']> = {
  travelMm: { x: 3060, y: 1530, z: 180 },
  maxFeedMmPerMin: { x: 30000, y: 30000, z: 10000 },
};
const ofKind = (r: ReturnType<typeof analyze>, kind: string) => r.findings.filter((f) => f.kind === kind);

describe('program checks', () => {
  it('spindle-off: feeding into the stock with the spindle stopped, reported once per run', () => {
    const w = new ProgramWriter();
    w.spindleOff();
    w.rapid(10, 10, 5).feed(10, 10, -3, 600).feed(50, 10, -3).feed(50, 50, -3).retract();
    const f = ofKind(analyze(w.build(), job(18)), 'spindle-off');
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ severity: 'error', line: 3 });
  });

  it('no spindle-off when the spindle turns', () => {
    const w = new ProgramWriter();
    w.rapid(10, 10, 5).feed(10, 10, -3, 600).feed(50, 10, -3).retract();
    expect(ofKind(analyze(w.build(), job(18)), 'spindle-off')).toHaveLength(0);
  });

  it('spoilboard-depth: 2 mm below the bottom is past the 1 mm allowance; 0.3 mm is not (the allowance is our own default, neither sourced nor computed; through-cuts commonly go a few tenths into the spoilboard: common practice, docs/references.md §5)', () => {
    const w = new ProgramWriter();
    w.rect(0, 0, 50, 50, [-18.3]);
    w.rect(100, 0, 150, 50, [-20]);
    const f = ofKind(analyze(w.build(), job(18)), 'spoilboard-depth');
    expect(f).toHaveLength(1);
    expect(f[0].severity).toBe('warning');
    expect(f[0].message).toMatch(/2\.00 mm below the sheet bottom/);
  });

  it('outside-sheet: cutting past the sheet edge by more than the tool radius', () => {
    const w = new ProgramWriter();
    w.rect(1200, 10, 1240, 40, [-5]);
    const r = analyze(w.build(), job(18));
    expect(ofKind(r, 'outside-sheet')).toHaveLength(1);
    const ok = new ProgramWriter();
    ok.rect(1200, 10, 1222, 40, [-5]); // 2 mm past the edge, within the 3.175 mm radius
    expect(ofKind(analyze(ok.build(), job(18)), 'outside-sheet')).toHaveLength(0);
  });

  it('outside-travel with a work offset: machine X = work X + offset', () => {
    const w = new ProgramWriter();
    w.rapid(100, 100, 5).feed(100, 100, -1, 600).feed(3000, 100, -1).retract();
    const near = analyze(w.build(), job(18, 'tape-glue', { machine: { ...machine, workOffset: { x: 100, y: 100, z: -100 } } }));
    expect(ofKind(near, 'outside-travel')).toHaveLength(1);
    expect(ofKind(near, 'outside-travel')[0].severity).toBe('error');
    const fine = analyze(w.build(), job(18, 'tape-glue', { machine: { ...machine, workOffset: { x: 10, y: 100, z: -100 } } }));
    expect(ofKind(fine, 'outside-travel')).toHaveLength(0);
  });

  it('outside-travel without a work offset: the program spans more than the travel', () => {
    const w = new ProgramWriter();
    w.rapid(0, 0, 5).rapid(3100, 0, 5);
    expect(ofKind(analyze(w.build(), job(18, 'tape-glue', { machine })), 'outside-travel')).toHaveLength(1);
  });

  it('feed-clamped: F40000 along X is above the 30000 mm/min X limit; along a 45° diagonal the limit is 30000·√2', () => {
    const w = new ProgramWriter();
    w.rapid(0, 0, 5).feed(500, 0, 5, 40000).feed(1000, 500, 5, 40000).feed(1500, 500, 5, 40000);
    const f = ofKind(analyze(w.build(), job(18, 'tape-glue', { machine })), 'feed-clamped');
    expect(f.map((x) => x.line)).toEqual([2, 4]);
    expect(f[0].severity).toBe('info');
  });

  it('feed-clamped at the lowest axis limit: F10000 straight down is exactly the Z limit and not clamped; F10100 is', () => {
    // along a pure Z move the limit is maxFeedMmPerMin.z = 10000 mm/min itself (one axis moves)
    const w = new ProgramWriter();
    w.rapid(0, 0, 5).feed(0, 0, -1, 10000).retract().feed(0, 0, -1, 10100).retract();
    const f = ofKind(analyze(w.build(), job(18, 'tape-glue', { machine })), 'feed-clamped');
    expect(f.map((x) => x.line)).toEqual([4]);
  });

  it('feed-clamped between the Z and the XY limits: F25000 level or on an arc is not clamped; a steep ramp at F25000 is', () => {
    // limit along a move = min over moving axes of maxFeedMmPerMin·len/|d|: a level move has no Z part
    // (limit ≥ 30000); the 45° ramp from Z 5 to Z −5 over 10 mm of X has len 10√2, so Z allows
    // 10000·√2 ≈ 14142 mm/min; a shallow ramp (10 mm down over 100 mm) allows 10000·√(100² + 10²)/10 ≈ 100499
    const w = new ProgramWriter();
    w.rapid(0, 0, 5).feed(500, 0, 5, 25000).arc(500, 100, 5, 500, 50, false, 25000).feed(510, 100, -5, 25000)
      .feed(610, 100, -15, 25000).arc(610, 200, -15, 610, 150, false, 31000);
    const f = ofKind(analyze(w.build(), job(18, 'tape-glue', { machine })), 'feed-clamped');
    expect(f.map((x) => x.line)).toEqual([4, 6]);
  });

  it('outside-sheet by an arc: its bulge, not its end points, decides; the square about its circle does not', () => {
    // half circles of radius 15 about (1210, 100) from (1210, 85) to (1210, 115) on the 1220 mm
    // wide sheet: counter-clockwise through the rightmost point X 1225, beyond the edge by more
    // than the 3.175 mm radius of T1; clockwise through the leftmost point X 1195, inside
    const half = (clockwise: boolean) => {
      const w = new ProgramWriter();
      w.rapid(1210, 85, 5).feed(1210, 85, -5, 600).arc(1210, 115, -5, 1210, 100, clockwise).retract();
      return ofKind(analyze(w.build(), job(18)), 'outside-sheet');
    };
    const out = half(false);
    expect(out).toHaveLength(1);
    expect(out[0].line).toBe(3);
    expect(out[0].message).toContain('X 1225.00');
    expect(half(true)).toHaveLength(0);
  });

  it('outside-travel by an arc without a work offset: the span grows to the arc\'s bulge only', () => {
    // travel X 1000: rapids span X 0–980, then a half circle of radius 25 about (980, 70) from
    // (980, 45) to (980, 95): counter-clockwise it reaches X 1005 (span 1005 > 1000),
    // clockwise X 955 (span stays 980)
    const span = (clockwise: boolean) => {
      const w = new ProgramWriter();
      w.rapid(0, 0, 5).rapid(980, 45, 5).feed(980, 45, -1, 600).arc(980, 95, -1, 980, 70, clockwise).retract();
      return ofKind(analyze(w.build(), job(18, 'tape-glue', { machine: { ...machine, travelMm: { ...machine.travelMm, x: 1000 } } })), 'outside-travel');
    };
    const out = span(false);
    expect(out).toHaveLength(1);
    expect(out[0].line).toBe(4);
    expect(span(true)).toHaveLength(0);
  });

  it('straight-plunge: 10 mm straight down with a 6.35 mm tool; a ramp is not (the 1 × D threshold is our own; ramp and helix entries spare the tool\'s end: common practice, docs/references.md §5)', () => {
    const w = new ProgramWriter();
    w.rapid(10, 10, 5).feed(10, 10, -10, 600).retract();
    w.rapid(100, 10, 5).feed(100, 10, 0, 600).feed(150, 10, -10, 600).retract();
    const r = analyze(w.build(), job(18));
    const f = ofKind(r, 'straight-plunge');
    expect(f).toHaveLength(1);
    expect(f[0].line).toBe(2);
    expect(r.plungePoints).toHaveLength(2);
    expect(r.plungePoints.at(0)).toMatchObject({ line: 2, x: 10, y: 10, depthMm: 10, feedMmPerMin: 600, ramp: false });
    expect(r.plungePoints.at(1)).toMatchObject({ line: 6, x: 150, depthMm: 10, ramp: true });
  });

  it('straight-plunge: a G81 drilling cycle plunges straight by design and is not reported; the same plunge by G1 is', () => {
    // NISTIR 6556 §3.5.16: G81 feeds straight down to Z and rapids out
    const run = (body: string) => {
      const { moves } = interpret(`G21 G90 G17\nT1 M6\nS18000 M3\nG0 X50 Y50 Z5\n${body}\nG0 Z5\nM30\n`);
      return ofKind(analyze(moves, job(18)), 'straight-plunge');
    };
    expect(run('G98 G81 X50 Y50 Z-15 R2 F600\nX80\nG80')).toHaveLength(0);
    expect(run('G1 Z-15 F600')).toHaveLength(1);
  });

  it('sheet-lift: an up-cut tool through a 3 mm sheet under clamps; not under vacuum, not with a down-cut tool, not in 18 mm (the 6.35 mm thin-sheet threshold: common practice, no published threshold; docs/references.md §5)', () => {
    const make = (tool: number) => {
      const w = new ProgramWriter();
      w.tool = tool;
      w.rect(10, 10, 200, 200, [-3.2]);
      return w.build();
    };
    const lift = ofKind(analyze(make(2), job(3, 'clamps')), 'sheet-lift');
    expect(lift).toHaveLength(1);
    expect(lift[0].severity).toBe('warning');
    expect(ofKind(analyze(make(2), job(3, 'vacuum')), 'sheet-lift')).toHaveLength(0);
    expect(ofKind(analyze(make(3), job(3, 'clamps')), 'sheet-lift')).toHaveLength(0);
    expect(ofKind(analyze(make(2), job(18, 'clamps')), 'sheet-lift')).toHaveLength(0);
  });

  it('a tool missing from the library is a finding, and the checks go on with diameter 0', () => {
    const w = new ProgramWriter();
    w.tool = 7;
    w.rect(0, 0, 100, 50, [-18.3]);
    const r = analyze(w.build(), job(18));
    expect(ofKind(r, 'unknown-tool')).toHaveLength(1);
    expect(r.parts[0].areaMm2).toBeCloseTo(5000, 6);
  });

  it('no sheet: an info finding says the through-cut checks were skipped; bad sheet fields are named', () => {
    const w = new ProgramWriter();
    w.rect(0, 0, 100, 50, [-18.3]);
    const none = analyze(w.build(), { ...job(18), sheet: null });
    expect(none.parts).toEqual([]);
    expect(ofKind(none, 'checks-skipped')).toHaveLength(1);
    const bad = analyze(w.build(), { ...job(18), sheet: { widthMm: 100, lengthMm: 100, thicknessMm: -3 } });
    expect(ofKind(bad, 'checks-skipped')[0].message).toContain('sheet.thicknessMm');
  });

  it('Z zero on the table: the bottom is Z 0 and the top Z T', () => {
    const w = new ProgramWriter({ x: 0, y: 0, z: 30 });
    w.safeZ = 25;
    w.rect(0, 0, 100, 50, [9, -0.2]);
    const r = analyze(w.build(), { ...job(18, 'clamps'), zZero: 'table' });
    expect(r.parts).toHaveLength(1);
    expect(r.summary.stockTopZ).toBe(18);
    expect(r.summary.sheetBottomZ).toBe(0);
  });

  it('the summary says the check is an aid, not a guarantee', () => {
    const w = new ProgramWriter();
    w.rect(0, 0, 100, 50, [-18.3]);
    expect(analyze(w.build(), job(18)).summary.note).toMatch(/aid, not a guarantee.*operator.*manual.*safety rules/);
  });

  it('many findings of one kind are capped and counted in the summary', () => {
    const w = new ProgramWriter();
    for (let i = 0; i < 40; i++) w.rapid(10 + i * 20, 10, 5).rapid(10 + i * 20, 10, -2).rapid(20 + i * 20, 10, -2).rapid(20 + i * 20, 10, 5);
    const r = analyze(w.build(), job(18));
    expect(ofKind(r, 'rapid-in-stock')).toHaveLength(25);
    expect(r.summary.suppressed['rapid-in-stock']).toBe(15);
  });
});

describe('crossing through cuts', () => {
  it('two overlapping profiles are reported and left out of the part list; a part clear of them is kept', () => {
    const w = new ProgramWriter();
    w.rect(0, 0, 100, 60, [-18.3]);
    w.rect(50, 30, 150, 90, [-18.3]); // crosses the first one twice
    w.rect(300, 0, 400, 60, [-18.3]);
    const r = analyze(w.build(), job(18));
    const f = r.findings.filter((x) => x.kind === 'crossing-cuts');
    expect(f).toHaveLength(2);
    expect(f[0].message).toMatch(/X 100\.00, Y 30\.00|X 50\.00, Y 60\.00/);
    expect(r.parts).toHaveLength(1);
    expect(r.parts[0].bbox.minX).toBeCloseTo(303.175, 6);
  });
});

describe('cut order with a pocket', () => {
  it('a pocket inside a part after its profile went through is a cut-order error; before it, none', () => {
    const pocket = (w: ProgramWriter) => w.rapid(40, 25, 5).feed(40, 25, -5, 600).feed(60, 25, -5).feed(60, 35, -5).retract();
    const late = new ProgramWriter();
    late.rect(0, 0, 100, 60, [-18.3]);
    pocket(late);
    const r = analyze(late.build(), job(18));
    const f = r.findings.filter((x) => x.kind === 'cut-order');
    expect(f).toHaveLength(1);
    expect(f[0].message).toContain(`line ${r.parts[0].freedAtLine}`);
    const early = new ProgramWriter();
    pocket(early);
    early.rect(0, 0, 100, 60, [-18.3]);
    expect(analyze(early.build(), job(18)).findings.filter((x) => x.kind === 'cut-order')).toHaveLength(0);
  });
});
