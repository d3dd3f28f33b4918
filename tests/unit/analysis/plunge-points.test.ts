// The plunge-point columns read back as the PlungePoint objects they stand for: at() follows
// Array.prototype.at (ECMA-262 §23.1.3.1: negative indexes count from the end, out of range is
// undefined), and JSON.stringify gives the same text as the list of objects would.
import { describe, expect, it } from 'vitest';
import { PlungePoints, type PlungePoint } from '@/lib/analysis';

function fill(n: number): { table: PlungePoints; list: PlungePoint[] } {
  const table = new PlungePoints();
  const list: PlungePoint[] = [];
  for (let i = 0; i < n; i++) {
    const p: PlungePoint = { line: 10 + i, x: i * 0.5, y: -i / 3, depthMm: 18.2, feedMmPerMin: i % 3 === 0 ? 0 : 1500, tool: 1 + (i % 4), ramp: i % 2 === 1, rapid: i % 3 === 0 };
    table.io[0] = p.x; table.io[1] = p.y; table.io[2] = p.depthMm; table.io[3] = p.feedMmPerMin;
    table.push(p.line, p.tool, p.ramp, p.rapid);
    list.push(p);
  }
  return { table, list };
}

describe('PlungePoints', () => {
  it('keeps every point past its first capacity, in order', () => {
    const { table, list } = fill(1000);
    expect(table.length).toBe(1000);
    expect(table.toArray()).toEqual(list);
    expect([...table]).toEqual(list);
  });

  it('at() counts from the end for a negative index and is undefined out of range', () => {
    const { table, list } = fill(5);
    expect(table.at(0)).toEqual(list[0]);
    expect(table.at(-1)).toEqual(list[4]);
    expect(table.at(5)).toBeUndefined();
    expect(table.at(-6)).toBeUndefined();
    expect(new PlungePoints().at(0)).toBeUndefined();
  });

  it('serializes as the list of objects', () => {
    const { table, list } = fill(300);
    expect(JSON.stringify({ plungePoints: table })).toBe(JSON.stringify({ plungePoints: list }));
  });
});
