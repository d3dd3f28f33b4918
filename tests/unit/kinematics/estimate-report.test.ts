// The estimate report (the CLI's --json and the stored estimate): the fields, the
// interpreter's diagnostics as findings with their code as kind, other findings and parts
// passed through.
import { describe, expect, it } from 'vitest';
import { buildEstimateReport, ENGINE_VERSION, estimate } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

describe('estimate report', () => {
  const e = estimate(new Moves({ x: 0, y: 0, z: -1 }).toolChange(2).feed(100, 0, -1, 3000).programStop().build(), testProfile());
  const file = { name: 'bracket.nc', sha256: 'ab'.repeat(32), lines: 4, units: 'mm' as const };

  it('has the fields of the issue and a semver engine', () => {
    const r = buildEstimateReport({ file, estimate: e, diagnostics: [] });
    // every key whose value has a unit names it (house style: totalSeconds, areaMm2)
    expect(Object.keys(r).sort()).toEqual(
      ['breakdownSeconds', 'calibratedSeconds', 'cuttingFeed', 'distanceMm', 'engine', 'file', 'findings', 'moves', 'parts', 'programStops', 'tools', 'totalSeconds'].sort(),
    );
    expect(Object.keys(r.cuttingFeed).sort()).toEqual(['achievedMmPerMin', 'commandedMmPerMin', 'lostShare']);
    expect(Object.keys(r.distanceMm).sort()).toEqual(['feed', 'rapid']);
    expect(Object.keys(r.breakdownSeconds).sort()).toEqual(['air', 'cutting', 'dwell', 'plunge', 'rapid', 'spindle', 'toolChange']);
    expect(r.engine).toBe(ENGINE_VERSION);
    expect(r.engine).toMatch(/^\d+\.\d+\.\d+$/); // semver.org §2
    expect(r.totalSeconds).toBeCloseTo(15 + 2.1, 6); // tool change + the 100 mm trapezoid
    expect(r.programStops).toBe(1);
    expect(r.tools).toEqual([{ tool: 2, seconds: expect.closeTo(17.1, 6), feedDistanceMm: 100 }]);
    expect(r.parts).toEqual([]);
  });

  it('turns diagnostics into findings and appends other findings and parts', () => {
    const r = buildEstimateReport({
      file,
      estimate: e,
      diagnostics: [{ line: 3, severity: 'warning', code: 'feed-missing', message: 'line 3: no feed', text: 'G1 X1' }],
      extraFindings: [{ kind: 'part-freed-small', severity: 'warning', line: 9, message: 'part 1 is small' }],
      parts: [{ id: 1 }],
    });
    expect(r.findings).toEqual([
      { kind: 'feed-missing', severity: 'warning', line: 3, message: 'line 3: no feed' },
      { kind: 'part-freed-small', severity: 'warning', line: 9, message: 'part 1 is small' },
    ]);
    expect(r.parts).toEqual([{ id: 1 }]);
  });
});
