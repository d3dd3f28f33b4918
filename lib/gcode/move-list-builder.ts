// A growable writer for the move list. Moves go into fixed-size chunks of typed arrays (no
// copying while growing); finish() copies them into exact-size arrays one field at a time,
// releasing each field's chunks as it goes, so the peak stays near one move list plus one
// field rather than the two or three lists that doubling a single array costs. The
// interpreter writes through it; planners, checks and tests can build move lists by hand.
//
//   const b = createMoveListBuilder({ x: 0, y: 0, z: 5 });
//   b.push(MoveKind.rapid, 10, 0, 5, 0, 1);                // kind, x, y, z, feedMmPerMin, line
//   b.push(MoveKind.feed, 10, 0, -3, 300, 2, 0, 1, 18000); // … flags, tool, spindleRpm, aux
//   b.pushArc(20, 10, -3, 800, 3, 0, 1, 18000, 10, 10, -3, 10, Math.PI / 2, 0);
//   const moves = b.finish();
//
// push() writes any record kind; pushArc() writes an arc move plus its arc-table row (centre
// cx cy cz, radius, signed sweep in radians, plane 0 = G17, 1 = G18, 2 = G19). Positions are
// mm in the G54 frame; the start of each move is the end of the previous one.
import { MoveKind, type ArcTable, type MoveKindCode, type MoveList, type Xyz } from './move-list';

type Field = 'x' | 'y' | 'z' | 'kind' | 'flags' | 'tool' | 'feed' | 'spindle' | 'aux' | 'line';
type ArcField = 'move' | 'cx' | 'cy' | 'cz' | 'radius' | 'sweep' | 'plane';
type Typed = Float64Array | Float32Array | Uint32Array | Uint16Array | Uint8Array;

const CHUNK = 1 << 16;
const ARC_CHUNK = 1 << 14;
const MOVE_BYTES = 8 * 3 + 1 + 1 + 2 + 4 * 3 + 4;
const ARC_BYTES = 4 + 8 * 5 + 1;

/** one chunk holds the per-move columns of the move list for CHUNK moves */
type MoveChunk = Pick<MoveList, 'x' | 'y' | 'z' | 'kind' | 'flags' | 'tool' | 'feed' | 'spindle' | 'aux' | 'line'>;

type ArcChunk = Omit<ArcTable, 'count'>;

function moveChunk(n: number): MoveChunk {
  return {
    x: new Float64Array(n),
    y: new Float64Array(n),
    z: new Float64Array(n),
    kind: new Uint8Array(n),
    flags: new Uint8Array(n),
    tool: new Uint16Array(n),
    feed: new Float32Array(n),
    spindle: new Float32Array(n),
    aux: new Float32Array(n),
    line: new Uint32Array(n),
  };
}

function arcChunk(n: number): ArcChunk {
  return {
    move: new Uint32Array(n),
    cx: new Float64Array(n),
    cy: new Float64Array(n),
    cz: new Float64Array(n),
    radius: new Float64Array(n),
    sweep: new Float64Array(n),
    plane: new Uint8Array(n),
  };
}

/** joins one field of all chunks into an exact-size array, dropping the chunks' arrays */
function join<C extends object, F extends keyof C>(chunks: C[], field: F, chunkSize: number, total: number, make: (n: number) => Typed): Typed {
  const out = make(total);
  let at = 0;
  for (const c of chunks) {
    const part = c[field] as unknown as Typed;
    const n = Math.min(chunkSize, total - at);
    out.set(n === part.length ? part : part.subarray(0, n), at);
    at += n;
    (c as Record<F, unknown>)[field] = null;
  }
  return out;
}

export interface MoveListBuilder {
  readonly count: number;
  readonly arcCount: number;
  /** end of the last move (the start point before any move) */
  readonly lastX: number;
  readonly lastY: number;
  readonly lastZ: number;
  push(kind: MoveKindCode, x: number, y: number, z: number, feedMmPerMin: number, line: number, flags?: number, tool?: number, spindleRpm?: number, aux?: number): number;
  pushArc(x: number, y: number, z: number, feedMmPerMin: number, line: number, flags: number, tool: number, spindleRpm: number, cx: number, cy: number, cz: number, radius: number, sweepRad: number, plane: 0 | 1 | 2): number;
  /** a record that does not move (dwell, tool change, spindle, stops) at the current position */
  pushAtRest(kind: MoveKindCode, line: number, flags?: number, tool?: number, spindleRpm?: number, aux?: number): number;
  /** exact-size arrays; the builder must not be used afterwards */
  finish(): MoveList;
  /** bytes currently reserved by the builder's arrays */
  reservedBytes(): number;
}

class Builder implements MoveListBuilder {
  count = 0;
  arcCount = 0;
  lastX: number;
  lastY: number;
  lastZ: number;
  private readonly sx: number;
  private readonly sy: number;
  private readonly sz: number;
  private readonly chunks: MoveChunk[] = [];
  private readonly arcChunks: ArcChunk[] = [];
  private c: MoveChunk;
  private ci = 0;
  private a: ArcChunk;
  private ai = 0;
  private readonly chunkSize: number;

  constructor(start: Xyz, chunkSize: number) {
    this.sx = this.lastX = start.x;
    this.sy = this.lastY = start.y;
    this.sz = this.lastZ = start.z;
    this.chunkSize = chunkSize;
    this.c = moveChunk(chunkSize);
    this.chunks.push(this.c);
    this.a = arcChunk(ARC_CHUNK);
    this.arcChunks.push(this.a);
  }

  push(kind: MoveKindCode, x: number, y: number, z: number, feed: number, line: number, flags = 0, tool = 0, spindle = 0, aux = 0): number {
    if (this.ci === this.chunkSize) {
      this.c = moveChunk(this.chunkSize);
      this.chunks.push(this.c);
      this.ci = 0;
    }
    const c = this.c;
    const i = this.ci++;
    c.x[i] = x;
    c.y[i] = y;
    c.z[i] = z;
    c.kind[i] = kind;
    c.flags[i] = flags;
    c.tool[i] = tool;
    c.feed[i] = feed;
    c.spindle[i] = spindle;
    c.aux[i] = aux;
    c.line[i] = line;
    this.lastX = x;
    this.lastY = y;
    this.lastZ = z;
    return this.count++;
  }

  pushAtRest(kind: MoveKindCode, line: number, flags = 0, tool = 0, spindle = 0, aux = 0): number {
    return this.push(kind, this.lastX, this.lastY, this.lastZ, 0, line, flags, tool, spindle, aux);
  }

  pushArc(x: number, y: number, z: number, feed: number, line: number, flags: number, tool: number, spindle: number, cx: number, cy: number, cz: number, radius: number, sweep: number, plane: 0 | 1 | 2): number {
    const i = this.push(MoveKind.arc, x, y, z, feed, line, flags, tool, spindle, 0);
    if (this.ai === ARC_CHUNK) {
      this.a = arcChunk(ARC_CHUNK);
      this.arcChunks.push(this.a);
      this.ai = 0;
    }
    const a = this.a;
    const k = this.ai++;
    a.move[k] = i;
    a.cx[k] = cx;
    a.cy[k] = cy;
    a.cz[k] = cz;
    a.radius[k] = radius;
    a.sweep[k] = sweep;
    a.plane[k] = plane;
    this.arcCount++;
    return i;
  }

  reservedBytes(): number {
    return this.chunks.length * this.chunkSize * MOVE_BYTES + this.arcChunks.length * ARC_CHUNK * ARC_BYTES;
  }

  finish(): MoveList {
    const n = this.count;
    const m = this.arcCount;
    const ch = this.chunks;
    const cs = this.chunkSize;
    const f = (field: Field, make: (n: number) => Typed) => join(ch, field, cs, n, make);
    const g = (field: ArcField, make: (n: number) => Typed) => join(this.arcChunks, field, ARC_CHUNK, m, make);
    const f64 = (k: number) => new Float64Array(k);
    const f32 = (k: number) => new Float32Array(k);
    return {
      count: n,
      startX: this.sx,
      startY: this.sy,
      startZ: this.sz,
      x: f('x', f64) as Float64Array,
      y: f('y', f64) as Float64Array,
      z: f('z', f64) as Float64Array,
      kind: f('kind', (k) => new Uint8Array(k)) as Uint8Array,
      flags: f('flags', (k) => new Uint8Array(k)) as Uint8Array,
      tool: f('tool', (k) => new Uint16Array(k)) as Uint16Array,
      feed: f('feed', f32) as Float32Array,
      spindle: f('spindle', f32) as Float32Array,
      aux: f('aux', f32) as Float32Array,
      line: f('line', (k) => new Uint32Array(k)) as Uint32Array,
      arcs: {
        count: m,
        move: g('move', (k) => new Uint32Array(k)) as Uint32Array,
        cx: g('cx', f64) as Float64Array,
        cy: g('cy', f64) as Float64Array,
        cz: g('cz', f64) as Float64Array,
        radius: g('radius', f64) as Float64Array,
        sweep: g('sweep', f64) as Float64Array,
        plane: g('plane', (k) => new Uint8Array(k)) as Uint8Array,
      },
    };
  }
}

/** chunkSize: moves per chunk (default 65,536); small values are for tests */
export function createMoveListBuilder(start: Xyz = { x: 0, y: 0, z: 0 }, chunkSize = CHUNK): MoveListBuilder {
  return new Builder(start, Math.max(1, chunkSize | 0));
}

/** bytes held by a finished move list's arrays */
export function moveListBytes(m: MoveList): number {
  const a = m.arcs;
  return [m.x, m.y, m.z, m.kind, m.flags, m.tool, m.feed, m.spindle, m.aux, m.line, a.move, a.cx, a.cy, a.cz, a.radius, a.sweep, a.plane].reduce((s, t) => s + t.byteLength, 0);
}
