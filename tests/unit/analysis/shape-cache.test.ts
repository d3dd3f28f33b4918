// The memo for repeated loops (lib/analysis/shape-cache, PartShapes) gives the same areas,
// perimeters and outlines as the uncached Clipper path for translated copies of a part, and the
// area-preserving arc flattening (areaRadius) encloses exactly the sector's area r²θ/2.
import { describe, expect, it } from 'vitest';
import { pathsAreaMm2, pathsBBox } from '@/lib/analysis/geometry';
import { areaRadius, type LoopInfo } from '@/lib/analysis/loops';
import { loopNode, type LoopNode } from '@/lib/analysis/nesting';
import { PartShapes, partShape } from '@/lib/analysis/parts';
import { lowest, shapeKey } from '@/lib/analysis/shape-cache';

/** a rounded rectangle (corner radius rc, drawn as chords) at (x0, y0), counter-clockwise */
function roundedRect(x0: number, y0: number, w: number, h: number, rc: number): { xs: number[]; ys: number[] } {
  const xs: number[] = [], ys: number[] = [];
  const corners = [[x0 + w - rc, y0 + rc, -90], [x0 + w - rc, y0 + h - rc, 0], [x0 + rc, y0 + h - rc, 90], [x0 + rc, y0 + rc, 180]];
  for (const [cx, cy, a] of corners) {
    for (let k = 0; k <= 8; k++) {
      const t = ((a + (90 * k) / 8) * Math.PI) / 180;
      xs.push(cx + rc * Math.cos(t));
      ys.push(cy + rc * Math.sin(t));
    }
  }
  return { xs, ys };
}

function circlePts(cx: number, cy: number, r: number, n = 40): { xs: number[]; ys: number[] } {
  const xs: number[] = [], ys: number[] = [];
  for (let k = 0; k < n; k++) {
    xs.push(cx + r * Math.cos((2 * Math.PI * k) / n));
    ys.push(cy + r * Math.sin((2 * Math.PI * k) / n));
  }
  return { xs, ys };
}

function node(pts: { xs: number[]; ys: number[] }, radiusMm: number): LoopNode {
  const info = { xs: Float64Array.from(pts.xs), ys: Float64Array.from(pts.ys) } as unknown as LoopInfo;
  return loopNode(info, radiusMm);
}

describe('shape cache', () => {
  it('translated copies of a part with a hole get the uncached areas, perimeters and outlines', () => {
    const shapes = new PartShapes();
    // whole micrometres keep the rounding the same (hits); 0.4 µm steps may round differently (misses)
    const offsets = [[0, 0], [200, 0], [0, 150], [1234.567, 987.001], [-50.0004, 33.3333], [200, 0]];
    for (const [dx, dy] of offsets) {
      const outer = node(roundedRect(10 + dx, 20 + dy, 150, 120, 9), 3.175);
      const hole = node(circlePts(60 + dx, 60 + dy, 12), 3.175);
      const cached = shapes.part(outer, [hole]);
      const plain = partShape(outer, [hole]);
      expect(cached.areaMm2).toBeCloseTo(plain.areaMm2, 9);
      expect(cached.perimeterMm).toBeCloseTo(plain.perimeterMm, 9);
      expect(pathsAreaMm2(cached.outline())).toBeCloseTo(pathsAreaMm2(plain.outline), 9);
      expect(pathsBBox(cached.outline())).toEqual(pathsBBox(plain.outline));
      expect(cached.bbox).toEqual(pathsBBox(plain.outline));
    }
    expect(shapes.parts.hits).toBeGreaterThanOrEqual(3);
    expect(shapes.parts.misses).toBeGreaterThanOrEqual(1);
  });

  it('given each ring\'s lowest vertex, the key is the one it works out itself; a loop entered elsewhere keys the same', () => {
    const outer = node(roundedRect(5, 7, 90, 60, 6), 3);
    const hole = node(circlePts(40, 30, 8), 3);
    const a = shapeKey([outer.ring, hole.ring], [3, 3]);
    const b = shapeKey([outer.ring, hole.ring], [3, 3], [lowest(outer.ring), lowest(hole.ring)]);
    expect(b.hash).toBe(a.hash);
    expect(Array.from(b.data)).toEqual(Array.from(a.data));
    // the same outline started at another vertex (rotation of the point list)
    const rot = (a: Float64Array) => Float64Array.from([...a.slice(11), ...a.slice(0, 11)]);
    const rotated = { x: rot(outer.ring.x), y: rot(outer.ring.y) };
    const c = shapeKey([rotated, hole.ring], [3, 3], [lowest(rotated), lowest(hole.ring)]);
    expect(Array.from(c.data)).toEqual(Array.from(a.data));
  });

  it('a different hole radius or tool radius is a different key', () => {
    const outer = node(roundedRect(0, 0, 100, 80, 5), 3);
    const a = shapeKey([outer.ring, node(circlePts(50, 40, 10), 3).ring], [3, 3]);
    const b = shapeKey([outer.ring, node(circlePts(50, 40, 10.01), 3).ring], [3, 3]);
    const c = shapeKey([outer.ring, node(circlePts(50, 40, 10), 3).ring], [3, 3.175]);
    expect(a.hash === b.hash && a.data.every((v, i) => v === b.data[i])).toBe(false);
    expect(a.hash === c.hash && a.data.every((v, i) => v === c.data[i])).toBe(false);
  });
});

describe('area-preserving arc chords', () => {
  // shoelace area of the fan (centre, end point on r, inner points on ρ, end point on r) against r²θ/2 (sector, closed form)
  for (const [r, thetaDeg, m] of [[10, 90, 2], [10, 90, 5], [4, 30, 3], [25, 360, 12], [3.175, 180, 7]]) {
    it(`r ${r}, sweep ${thetaDeg}°, ${m} chords enclose r²θ/2`, () => {
      const theta = (thetaDeg * Math.PI) / 180;
      const rho = areaRadius(r, theta, m);
      const xs = [0], ys = [0];
      for (let k = 0; k <= m; k++) {
        const rr = k === 0 || k === m ? r : rho;
        xs.push(rr * Math.cos((theta * k) / m));
        ys.push(rr * Math.sin((theta * k) / m));
      }
      let a2 = 0;
      for (let i = 0; i < xs.length; i++) {
        const j = (i + 1) % xs.length;
        a2 += xs[i] * ys[j] - xs[j] * ys[i];
      }
      expect(a2 / 2).toBeCloseTo((r * r * theta) / 2, 9);
      expect(rho).toBeGreaterThan(r);
    });
  }
});
