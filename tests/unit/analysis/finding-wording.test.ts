// How findings are worded: each a full sentence that leaves its own line number to the
// finding's `line`; where a piece can come loose (a freed part, a slug, a rapid through
// stock, a cut with the spindle stopped) the sentence says a thrown piece can hurt someone
// nearby; outside-travel says what the machine may do. The wording rules are the product's
// own (DEVELOPERS.md: findings are findings, never permission), checked on small programs.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze, type AnalysisInput, type Finding } from '@/lib/analysis';
import { interpret } from '@/lib/gcode';
import { ProgramWriter } from './support/program';
import { job } from './support/jobs';

const machine: NonNullable<AnalysisInput['machine']> = {
  travelMm: { x: 3060, y: 1530, z: 180 },
  maxFeedMmPerMin: { x: 30000, y: 30000, z: 10000 },
};
const checksDir = path.resolve(__dirname, '../../../fixtures/programs/checks');
const load = (name: string) => interpret(readFileSync(path.join(checksDir, name), 'utf8')).moves;
const THROWN = /A thrown piece can hurt someone nearby: stand clear and keep the guards closed, as the shop's rules require\./;

/** a full sentence that does not repeat its own line number */
function expectSentence(f: Finding): void {
  expect(f.message, f.kind).toMatch(/^[A-Z].*[.)]$/s);
  if (f.line > 0) expect(f.message, f.kind).not.toMatch(new RegExp(`\\bline ${f.line}\\b`));
}

function only(findings: Finding[], kind: string): Finding {
  const f = findings.filter((x) => x.kind === kind);
  expect(f, kind).toHaveLength(1);
  return f[0];
}

describe('finding wording', () => {
  it('spindle-off names the consequence: a broken tool, a thrown part', () => {
    const w = new ProgramWriter();
    w.spindleOff();
    w.rapid(10, 10, 5).feed(10, 10, -3, 600).feed(50, 10, -3).retract();
    const f = only(analyze(w.build(), job(18)).findings, 'spindle-off');
    expectSentence(f);
    expect(f.message).toMatch(/break/);
    expect(f.message).toMatch(/thrown/);
    expect(f.message).toMatch(THROWN);
  });

  it('rapid-in-stock warns that a thrown piece can hurt someone nearby', () => {
    const w = new ProgramWriter();
    w.rapid(10, 10, 5).feed(10, 10, -3, 600).rapid(60, 10, -3).retract();
    const f = only(analyze(w.build(), job(18)).findings, 'rapid-in-stock');
    expectSentence(f);
    expect(f.message).toMatch(THROWN);
  });

  it('outside-travel says the machine may stop on a limit or hit its frame (with and without a work offset)', () => {
    const offset = new ProgramWriter();
    offset.rapid(100, 100, 5).feed(100, 100, -1, 600).feed(3000, 100, -1).retract();
    const withOffset = only(analyze(offset.build(), job(18, 'tape-glue', { machine: { ...machine, workOffset: { x: 100, y: 100, z: -100 } } })).findings, 'outside-travel');
    const span = new ProgramWriter();
    span.rapid(0, 0, 5).rapid(3100, 0, 5);
    const bySpan = only(analyze(span.build(), job(18, 'tape-glue', { machine })).findings, 'outside-travel');
    for (const f of [withOffset, bySpan]) {
      expectSentence(f);
      expect(f.message).toMatch(/may stop on a limit/);
      expect(f.message).toMatch(/hit its frame/);
      expect(f.message).not.toMatch(/will stop/);
    }
  });

  it('an unheld part and its loose slug both warn of a thrown piece', () => {
    const r = analyze(load('plate-with-hole-through.nc'), job(18, 'clamps'));
    const part = only(r.findings, 'unheld-part');
    expectSentence(part);
    expect(part.message).toMatch(THROWN);
    const slug = r.findings.find((f) => f.kind === 'loose-slug')!;
    expectSentence(slug);
    expect(slug.message).toMatch(THROWN);
  });

  it('cut-order after the part is free names the profile line and warns of a thrown piece', () => {
    const f = only(analyze(load('hole-after-profile.nc'), job(18, 'tape-glue')).findings, 'cut-order');
    expectSentence(f);
    expect(f.message).toMatch(/line 11/);
    expect(f.message).toMatch(THROWN);
  });

  it('with no hold-down given, the reason says so and does not claim tabs were chosen', () => {
    const f = only(analyze(load('plate-with-hole-through.nc'), job(18, 'tape-glue', { holdDown: null })).findings, 'unheld-part');
    expect(f.message).toMatch(/no hold-down was given, so only tabs or onion skin left by the program count/);
    expect(f.message).not.toMatch(/the hold-down is tabs/);
  });

  it('every finding of a program full of faults is a sentence without its own line number', () => {
    const w = new ProgramWriter();
    w.spindleOff();
    w.rapid(10, 10, 5).feed(10, 10, -3, 600).retract();
    w.spindleOn();
    w.rapid(20, 20, 5).feed(20, 20, -3, 600).rapid(60, 20, -3).retract();
    w.rect(1200, 10, 1240, 40, [-5]);
    w.rect(0, 100, 50, 150, [-20]);
    w.rapid(0, 0, 5).feed(500, 0, 5, 40000);
    w.toolChange(7);
    w.rapid(300, 300, 5).feed(300, 300, -19, 600).feed(340, 300, -19).retract();
    const r = analyze(w.build(), job(18, 'vacuum', { machine, vacuumKpa: 60 }));
    const kinds = new Set(r.findings.map((f) => f.kind));
    for (const k of ['spindle-off', 'rapid-in-stock', 'outside-sheet', 'spoilboard-depth', 'feed-clamped', 'unknown-tool']) expect(kinds, k).toContain(k);
    for (const f of r.findings) expectSentence(f);
  });
});
