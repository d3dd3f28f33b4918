// Hand-built move lists for the planner tests: fills the MoveList typed arrays directly, so the
// tests do not depend on the interpreter.
import { MoveFlag, MoveKind, type MoveList } from '@/lib/gcode/move-list';
import type { MachineProfile } from '@/lib/validation/machine-profile';

interface Rec {
  kind: number;
  x: number;
  y: number;
  z: number;
  feed: number;
  flags: number;
  tool: number;
  aux: number;
  arc?: { cx: number; cy: number; cz: number; radius: number; sweep: number; plane: number };
}

export class Moves {
  private recs: Rec[] = [];
  private cx: number;
  private cy: number;
  private cz: number;
  tool = 0;
  flags = 0;
  constructor(private readonly start = { x: 0, y: 0, z: 0 }) {
    this.cx = start.x;
    this.cy = start.y;
    this.cz = start.z;
  }
  private add(kind: number, x: number, y: number, z: number, feed: number, aux = 0, arc?: Rec['arc']): this {
    this.recs.push({ kind, x, y, z, feed, flags: this.flags, tool: this.tool, aux, arc });
    this.cx = x;
    this.cy = y;
    this.cz = z;
    return this;
  }
  rapid(x: number, y: number, z: number) { return this.add(MoveKind.rapid, x, y, z, 0); }
  feed(x: number, y: number, z: number, f: number) { return this.add(MoveKind.feed, x, y, z, f); }
  /** G17 arc from the current point about (cx, cy) by `sweep` rad (positive CCW), rising dz. */
  arcXY(cx: number, cy: number, sweep: number, f: number, dz = 0) {
    const r = Math.hypot(this.cx - cx, this.cy - cy);
    const a1 = Math.atan2(this.cy - cy, this.cx - cx) + sweep;
    return this.add(MoveKind.arc, cx + r * Math.cos(a1), cy + r * Math.sin(a1), this.cz + dz, f, 0, { cx, cy, cz: this.cz, radius: r, sweep, plane: 0 });
  }
  dwell(s: number) { return this.add(MoveKind.dwell, this.cx, this.cy, this.cz, 0, s); }
  toolChange(t: number) { this.tool = t; return this.add(MoveKind.toolChange, this.cx, this.cy, this.cz, 0); }
  spindleStart() { this.flags |= MoveFlag.spindleOn; return this.add(MoveKind.spindleStart, this.cx, this.cy, this.cz, 0); }
  spindleStop() { this.flags &= ~MoveFlag.spindleOn; return this.add(MoveKind.spindleStop, this.cx, this.cy, this.cz, 0); }
  programStop() { return this.add(MoveKind.programStop, this.cx, this.cy, this.cz, 0); }
  exactStop(on: boolean) { this.flags = on ? this.flags | MoveFlag.exactStop : this.flags & ~MoveFlag.exactStop; return this; }
  build(): MoveList {
    const n = this.recs.length;
    const arcs = this.recs.map((r, i) => [r, i] as const).filter(([r]) => r.arc);
    const m: MoveList = {
      count: n, startX: this.start.x, startY: this.start.y, startZ: this.start.z,
      x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n),
      kind: new Uint8Array(n), flags: new Uint8Array(n), tool: new Uint16Array(n),
      feed: new Float32Array(n), spindle: new Float32Array(n), aux: new Float32Array(n), line: new Uint32Array(n),
      arcs: {
        count: arcs.length, move: new Uint32Array(arcs.length), cx: new Float64Array(arcs.length), cy: new Float64Array(arcs.length),
        cz: new Float64Array(arcs.length), radius: new Float64Array(arcs.length), sweep: new Float64Array(arcs.length), plane: new Uint8Array(arcs.length),
      },
    };
    this.recs.forEach((r, i) => {
      m.x[i] = r.x; m.y[i] = r.y; m.z[i] = r.z; m.kind[i] = r.kind; m.flags[i] = r.flags; m.tool[i] = r.tool;
      m.feed[i] = r.feed; m.aux[i] = r.aux; m.line[i] = i + 1; m.spindle[i] = r.flags & MoveFlag.spindleOn ? 18000 : 0;
    });
    arcs.forEach(([r, i], k) => {
      const a = r.arc!;
      m.arcs.move[k] = i; m.arcs.cx[k] = a.cx; m.arcs.cy[k] = a.cy; m.arcs.cz[k] = a.cz;
      m.arcs.radius[k] = a.radius; m.arcs.sweep[k] = a.sweep; m.arcs.plane[k] = a.plane;
    });
    return m;
  }
}

/** A profile with round limits so that closed forms are easy to state; override per test. */
export function testProfile(over: Partial<MachineProfile> = {}): MachineProfile {
  return {
    name: 'Test router',
    travelMm: { x: 3000, y: 1500, z: 200 },
    homeMm: { x: 0, y: 0, z: 0 },
    maxFeedMmPerMin: { x: 60000, y: 60000, z: 60000 },
    rapidMmPerMin: { x: 60000, y: 60000, z: 60000 },
    accelMmPerS2: { x: 500, y: 500, z: 500 },
    cornerToleranceMm: 0.01,
    lookaheadBlocks: 0,
    maxBlocksPerS: 0,
    chordToleranceMm: 0.003,
    toolChangeSeconds: 15,
    spindleSpinUpSeconds: 3,
    timeFactor: 1,
    tools: [],
    ...over,
  };
}
