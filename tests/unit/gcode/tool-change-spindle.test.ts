// NISTIR 6556 §3.6.3 (tool change, M6): "when the tool change is complete, the spindle will be
// stopped". So an M3/M4 after a change starts the spindle from rest (one spin-up in the
// estimate), and a cut after a change with no new M3/M4 is a cut with the spindle stopped.
// Checked through the interpreter's move list, the estimate and the analysis.
import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/analysis';
import { MoveFlag, MoveKind } from '@/lib/gcode';
import { estimate } from '@/lib/kinematics';
import { job } from '../analysis/support/jobs';
import { testProfile } from '../kinematics/support/moves';
import { run } from './helpers';

const TOOL_CHANGE_S = 10;
const SPIN_UP_S = 4;
const profile = testProfile({ toolChangeSeconds: TOOL_CHANGE_S, spindleSpinUpSeconds: SPIN_UP_S });

function spindleStarts(text: string): number {
  const m = run(text).moves;
  let n = 0;
  for (let i = 0; i < m.count; i++) if (m.kind[i] === MoveKind.spindleStart) n++;
  return n;
}

describe('NISTIR 6556 §3.6.3: the spindle is stopped once M6 completes', () => {
  it('the tool-change record and the moves after it carry a stopped spindle until the next M3', () => {
    const r = run('G21 F600\nS18000 M3\nG1 X10\nT2 M6\nG1 X20\nM3\nG1 X30\nM2');
    const m = r.moves;
    const at = (line: number, kind: number) => {
      for (let i = 0; i < m.count; i++) if (m.line[i] === line && m.kind[i] === kind) return i;
      throw new Error(`no move of kind ${kind} on line ${line}`);
    };
    const before = at(3, MoveKind.feed);
    const change = at(4, MoveKind.toolChange);
    const after = at(5, MoveKind.feed);
    const restarted = at(7, MoveKind.feed);
    expect(m.flags[before] & MoveFlag.spindleOn).toBe(MoveFlag.spindleOn);
    expect(m.flags[change] & MoveFlag.spindleOn).toBe(0);
    expect(m.spindle[change]).toBe(0);
    expect(m.flags[after] & MoveFlag.spindleOn).toBe(0);
    expect(m.spindle[after]).toBe(0);
    // §3.6.3 "no other changes will be made": the S speed stays in force, so a bare M3 restarts at it
    expect(m.flags[restarted] & MoveFlag.spindleOn).toBe(MoveFlag.spindleOn);
    expect(m.spindle[restarted]).toBe(18000);
    expect(m.tool[restarted]).toBe(2);
    expect(r.diagnostics.filter((d) => d.code === 'spindle-speed-missing')).toEqual([]);
  });

  it('M6 leaves M4 (counter-clockwise) off too', () => {
    const m = run('G21 F600\nS12000 M4\nT1 M6\nG1 X10\nM2').moves;
    const feed = Array.from(m.kind).indexOf(MoveKind.feed);
    expect(m.flags[feed] & (MoveFlag.spindleOn | MoveFlag.spindleCcw)).toBe(0);
  });

  it('an M3 after each change is a start from rest: one spindle-start record per change', () => {
    expect(spindleStarts('S18000 M3\nT1 M6\nM3\nT2 M6\nM3\nM2')).toBe(3);
    // M3 on the M6 line also starts it again: §3.8 orders the tool change (step 5) before spindle on (step 6)
    expect(spindleStarts('S18000 M3\nT1 M6 M3\nT2 M6 M3\nM2')).toBe(3);
    // without a change in between, a second M3 while turning is no new start (§3.6.2)
    expect(spindleStarts('S18000 M3\nM3\nM2')).toBe(1);
  });

  it('estimate: the M3 after a change adds one spin-up, so time = changes × change time + starts × spin-up', () => {
    // no motion, so the time is the fixed records alone
    const text = 'G21\nS18000 M3\nT1 M6\nM3\nT2 M6\nM3\nM30';
    const e = estimate(run(text).moves, profile);
    expect(e.totalSeconds).toBeCloseTo(2 * TOOL_CHANGE_S + 3 * SPIN_UP_S, 9);
    // with M6 and M3 on one line the order of §3.8 gives the same count
    const e2 = estimate(run('G21\nS18000 M3\nT1 M6 M3\nT2 M6 M3\nM30').moves, profile);
    expect(e2.totalSeconds).toBeCloseTo(2 * TOOL_CHANGE_S + 3 * SPIN_UP_S, 9);
  });

  it('analysis: a cut after M6 with no new M3 is a spindle-off finding on the line that enters the stock', () => {
    const lines = [
      'G21 G90 G17', //            1
      'T1 M6', //                  2
      'S18000 M3', //              3
      'G0 X10 Y10 Z5', //          4
      'G1 Z-3 F900', //            5  first tool cuts with the spindle turning
      'G1 X50 F3000', //           6
      'G0 Z5', //                  7
      'T2 M6', //                  8  the change stops the spindle
      'G0 X100 Y10', //            9
      'G1 Z-3 F900', //           10  into the stock with it stopped
      'G1 X150 F3000', //         11
      'G0 Z5', //                 12
      'M5', //                    13
      'M30', //                   14
    ];
    const dry = analyze(run(lines.join('\n')).moves, job(18)).findings.filter((f) => f.kind === 'spindle-off');
    expect(dry).toHaveLength(1);
    expect(dry[0]).toMatchObject({ severity: 'error', line: 10 });

    // the same program with M3 after the change: no finding
    const fixed = [...lines.slice(0, 8), 'M3', ...lines.slice(8)];
    expect(analyze(run(fixed.join('\n')).moves, job(18)).findings.filter((f) => f.kind === 'spindle-off')).toEqual([]);
  });
});
