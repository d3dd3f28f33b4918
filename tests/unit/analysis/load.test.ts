// Loading the analysis (the contract of loadAnalysis() in lib/analysis/index.ts): analyze() and
// the geometry helpers refuse to run, naming loadAnalysis(), until the WebAssembly Clipper is
// loaded; every call shares one promise. A fresh copy of the modules is imported, since the
// unit project's setup file has loaded the shared one.
import { describe, expect, it, vi } from 'vitest';
import { ProgramWriter } from './support/program';
import { job } from './support/jobs';

describe('loadAnalysis', () => {
  it('analyze() and the geometry helpers throw before it, and work after it; one shared promise', async () => {
    vi.resetModules();
    const analysis = await import('@/lib/analysis');
    const geometry = await import('@/lib/analysis/geometry/polygons');
    const w = new ProgramWriter();
    w.tool = 9;
    w.rect(0, 0, 100, 50, [-18.3]);
    const moves = w.build();
    const square = geometry.toPath([0, 10, 10, 0], [0, 0, 10, 10]);
    const notLoaded = /await loadAnalysis\(\)/;
    expect(() => analysis.analyze(moves, job(18))).toThrow(notLoaded);
    expect(() => analysis.analyze(moves, { ...job(18), sheet: null })).toThrow(notLoaded); // before any geometry is reached
    expect(() => geometry.offsetPaths([square], 1)).toThrow(notLoaded);
    expect(() => geometry.differencePaths([square], [square])).toThrow(notLoaded);
    expect(() => geometry.pathsAreaMm2([square])).toThrow(notLoaded);
    expect(() => geometry.pointInPath(5, 5, square)).toThrow(notLoaded);

    const loading = analysis.loadAnalysis();
    expect(analysis.loadAnalysis()).toBe(loading);
    await loading;
    expect(analysis.analyze(moves, job(18)).parts.map((p) => p.areaMm2)).toEqual([5000]); // 100 × 50 mm, zero-width tool
    expect(geometry.pathsAreaMm2([square])).toBe(100);
  });
});
