// Streaming look-ahead planner over straight blocks.
//
// Model (pinned by tests/unit/kinematics):
// - Each block has a cruise limit v (already projected per axis and capped by F, block rate
//   and, on arcs, √(a·r)), an acceleration limit a and a length d; it runs a trapezoidal
//   profile between its entry and exit speeds (trapezoid.ts).
// - The speed at a vertex is capped by the corner speed limit (corner-speed.ts) and by both
//   blocks' cruise limits. After a forced stop (flush) the next block starts from rest.
// - Look-ahead of N blocks: when block i starts, the planner holds blocks i … i+N−1 and must
//   be able to stop at the end of block i+N−1, as if the program ended there. So the exit
//   speed of block i is at most the backward-reachable speed from rest over blocks
//   i+1 … i+N−1: on a straight run v² ≤ 2·a·(distance held ahead of the current point).
//   N = 1 stops at the end of every block; N = 0 holds everything up to the next forced stop.
//
// The backward pass b²_j = min(cap²_{j+1}, b²_{j+1} + w_{j+1}) (w = 2·a·d, cap² the squared
// corner cap, b²_e = 0 at the window end e) unrolls, with prefix sums S_j = Σ_{i≤j} w_i, to
//   b²_j = min( min_{j<k≤e} (cap²_k + S_{k−1}),  S_e ) − S_j,
// so the exit bound of the oldest block is a sliding-window minimum, kept in a monotonic
// deque: O(1) amortised per block whatever N is. The forward pass on execution takes
// v1² = min(b²_i, v0² + w_i); the trapezoid closed form gives the block's time.
//
// Memory: a ring of typed arrays (61 bytes a slot) of N blocks, or for N = 0 as many as lie
// between two forced stops.

import { cornerSpeedLimit } from './corner-speed';
import type { Timeline } from './timeline';
import { blockDurationS } from './trapezoid';

const cornerSpeed = cornerSpeedLimit;
const duration = blockDurationS;
const SLOT_BYTES = 7 * 8 + 4 + 1;

export class BlockPlanner {
  private capacity: number;
  private mask: number;
  private len: Float64Array;
  private vmax: Float64Array;
  private acc: Float64Array;
  /** prefix sum S after the block */
  private sAt: Float64Array;
  private mv: Uint32Array;
  private cat: Uint8Array;
  private head = 0;
  private size = 0;
  /** sequence number of the oldest held block */
  private headSeq = 0;
  /** S after the newest block */
  private sEnd = 0;
  // monotonic deque of (sequence, cap²_k + S_{k−1}), values increasing from the front
  private dqSeq: Float64Array;
  private dqVal: Float64Array;
  private dqHead = 0;
  private dqSize = 0;
  /** entry speed of the oldest held block: the exit speed of the last executed one */
  private v0 = 0;
  private hasPrev = false;
  private pux = 0;
  private puy = 0;
  private puz = 0;
  private pvmax = 0;
  private readonly lookaheadBlocks: number;
  private readonly sink: Timeline;
  private readonly accelX: number;
  private readonly accelY: number;
  private readonly accelZ: number;
  private readonly cornerTol: number;
  peakBlocks = 0;
  // the run of executed blocks not yet handed to the sink
  private runMove = -1;
  private runKind = 0;
  private runLen = 0;
  private runS = 0;
  private runBlocks = 0;

  constructor(sink: Timeline, lookaheadBlocks: number, accel: { x: number; y: number; z: number }, cornerToleranceMm: number) {
    this.sink = sink;
    this.lookaheadBlocks = lookaheadBlocks;
    this.accelX = accel.x;
    this.accelY = accel.y;
    this.accelZ = accel.z;
    this.cornerTol = cornerToleranceMm;
    let c = 16;
    while (c < lookaheadBlocks + 1) c *= 2;
    this.capacity = c;
    this.mask = c - 1;
    this.len = new Float64Array(c);
    this.vmax = new Float64Array(c);
    this.acc = new Float64Array(c);
    this.sAt = new Float64Array(c);
    this.mv = new Uint32Array(c);
    this.cat = new Uint8Array(c);
    this.dqSeq = new Float64Array(c);
    this.dqVal = new Float64Array(c);
  }

  /** Bytes held by the ring now. */
  get bytes(): number {
    return this.capacity * SLOT_BYTES;
  }

  /**
   * Adds a block of `move` along the unit vector (ux,uy,uz); `vmax` and `accel` are its own
   * limits (mm/s, mm/s²). `cornerFree`: the caller knows the corner speed to the previous
   * block is at least both limits (chords inside one arc), so the formula is skipped.
   */
  push(move: number, kind: number, lengthMm: number, ux: number, uy: number, uz: number, vmax: number, accel: number, cornerFree = false): void {
    if (this.size === this.capacity) this.grow();
    let c2 = 0;
    if (this.hasPrev) {
      let v = cornerFree ? Infinity : cornerSpeed(this.pux, this.puy, this.puz, ux, uy, uz, this.accelX, this.accelY, this.accelZ, this.cornerTol);
      if (v > vmax) v = vmax;
      if (v > this.pvmax) v = this.pvmax;
      c2 = v * v;
    }
    const k = (this.head + this.size) & this.mask;
    const seq = this.headSeq + this.size;
    const value = c2 + this.sEnd;
    this.sEnd += 2 * accel * lengthMm;
    this.len[k] = lengthMm;
    this.vmax[k] = vmax;
    this.acc[k] = accel;
    this.sAt[k] = this.sEnd;
    this.mv[k] = move;
    this.cat[k] = kind;
    this.size++;
    if (this.size > this.peakBlocks) this.peakBlocks = this.size;
    this.hasPrev = true;
    this.pux = ux;
    this.puy = uy;
    this.puz = uz;
    this.pvmax = vmax;

    const m = this.mask;
    const dqVal = this.dqVal;
    while (this.dqSize > 0 && dqVal[(this.dqHead + this.dqSize - 1) & m] >= value) this.dqSize--;
    const back = (this.dqHead + this.dqSize) & m;
    this.dqSeq[back] = seq;
    dqVal[back] = value;
    this.dqSize++;

    if (this.lookaheadBlocks > 0 && this.size >= this.lookaheadBlocks) this.executeOldest();
  }

  private executeOldest(): void {
    const i = this.head;
    const m = this.mask;
    const seq = this.headSeq;
    while (this.dqSize > 0 && this.dqSeq[this.dqHead] <= seq) {
      this.dqHead = (this.dqHead + 1) & m;
      this.dqSize--;
    }
    let bound = this.sEnd;
    if (this.dqSize > 0 && this.dqVal[this.dqHead] < bound) bound = this.dqVal[this.dqHead];
    const d = this.len[i];
    const a = this.acc[i];
    const v0 = this.v0;
    let v1s = bound - this.sAt[i];
    const reach = v0 * v0 + 2 * a * d;
    if (reach < v1s) v1s = reach;
    const v1 = v1s > 0 ? Math.sqrt(v1s) : 0;
    const t = duration(d, this.vmax[i], a, v0, v1);
    // consecutive blocks of one move and kind (an arc's chords) reach the sink as one
    const move = this.mv[i];
    const kind = this.cat[i];
    if (move === this.runMove && kind === this.runKind) {
      this.runLen += d;
      this.runS += t;
      this.runBlocks++;
    } else {
      if (this.runBlocks > 0) this.sink.block(this.runMove, this.runKind, this.runLen, this.runS, this.runBlocks);
      this.runMove = move;
      this.runKind = kind;
      this.runLen = d;
      this.runS = t;
      this.runBlocks = 1;
    }
    this.v0 = v1;
    this.head = (i + 1) & m;
    this.headSeq++;
    this.size--;
  }

  /** Forced stop: runs every held block, the last one to rest; the next block starts from rest. */
  flush(): void {
    while (this.size > 0) this.executeOldest();
    if (this.runBlocks > 0) this.sink.block(this.runMove, this.runKind, this.runLen, this.runS, this.runBlocks);
    this.runBlocks = 0;
    this.runMove = -1;
    this.v0 = 0;
    this.hasPrev = false;
    // nothing is held: restart the prefix sums so they stay small
    this.sEnd = 0;
    this.dqSize = 0;
  }

  private grow(): void {
    const c = this.capacity * 2;
    const m = this.mask;
    const remap = <T extends Float64Array | Uint32Array | Uint8Array>(src: T, dst: T, from: number, n: number): T => {
      for (let j = 0; j < n; j++) dst[j] = src[(from + j) & m];
      return dst;
    };
    this.len = remap(this.len, new Float64Array(c), this.head, this.size);
    this.vmax = remap(this.vmax, new Float64Array(c), this.head, this.size);
    this.acc = remap(this.acc, new Float64Array(c), this.head, this.size);
    this.sAt = remap(this.sAt, new Float64Array(c), this.head, this.size);
    this.mv = remap(this.mv, new Uint32Array(c), this.head, this.size);
    this.cat = remap(this.cat, new Uint8Array(c), this.head, this.size);
    this.dqSeq = remap(this.dqSeq, new Float64Array(c), this.dqHead, this.dqSize);
    this.dqVal = remap(this.dqVal, new Float64Array(c), this.dqHead, this.dqSize);
    this.head = 0;
    this.dqHead = 0;
    this.capacity = c;
    this.mask = c - 1;
  }
}
