// Time accounting of an estimate: the cumulative clock at the end of every move, seconds by
// kind, per tool, distances and the commanded-vs-achieved feed of cutting blocks. Fed by the
// planner one executed block at a time and by the estimator for timed records (dwell, tool
// change, spindle). Every second goes to exactly one kind and one tool, so both add up to the
// total.

import type { MoveList } from '../gcode/move-list';

/** Kinds of time; the first four are block categories chosen when a block is planned. */
export const TimeKind = { cutting: 0, air: 1, rapid: 2, plunge: 3, dwell: 4, toolChange: 5, spindle: 6, none: 7 } as const;

const RAPID = TimeKind.rapid;
const CUTTING = TimeKind.cutting;

interface ToolTally {
  tool: number;
  seconds: number;
  feedDistanceMm: number;
}

export class Timeline {
  readonly cumulativeS: Float64Array;
  /** seconds by TimeKind */
  readonly byKind = new Float64Array(8);
  totalS = 0;
  feedDistanceMm = 0;
  rapidDistanceMm = 0;
  cuttingDistanceMm = 0;
  /** Σ length / commanded feed over cutting blocks: their time had they run at F throughout */
  cuttingCommandedS = 0;
  blocks = 0;
  private nextMove = 0;
  private readonly tools = new Map<number, ToolTally>();
  private current: ToolTally | null = null;
  private readonly toolOf: Uint16Array;
  private readonly feedOf: Float32Array;

  constructor(moves: MoveList) {
    this.cumulativeS = new Float64Array(moves.count);
    this.toolOf = moves.tool;
    this.feedOf = moves.feed;
  }

  private tally(move: number): ToolTally {
    const tool = this.toolOf[move];
    let t = this.current;
    if (t && t.tool === tool) return t;
    t = this.tools.get(tool) ?? null;
    if (!t) {
      t = { tool, seconds: 0, feedDistanceMm: 0 };
      this.tools.set(tool, t);
    }
    this.current = t;
    return t;
  }

  /** Moves before `move` with no time of their own (zero length) end at the current clock. */
  private catchUp(move: number): void {
    const cum = this.cumulativeS;
    const t = this.totalS;
    while (this.nextMove < move) cum[this.nextMove++] = t;
    if (this.nextMove === move) this.nextMove = move + 1;
  }

  /** Executed planner blocks (`blocks` of them, consecutive, one kind) of `move`. */
  block(move: number, kind: number, lengthMm: number, durationS: number, blocks: number): void {
    if (this.nextMove <= move) this.catchUp(move);
    this.totalS += durationS;
    this.cumulativeS[move] = this.totalS;
    this.byKind[kind] += durationS;
    this.blocks += blocks;
    const tally = this.tally(move);
    tally.seconds += durationS;
    if (kind === RAPID) {
      this.rapidDistanceMm += lengthMm;
    } else {
      this.feedDistanceMm += lengthMm;
      tally.feedDistanceMm += lengthMm;
      if (kind === CUTTING) {
        this.cuttingDistanceMm += lengthMm;
        const f = this.feedOf[move];
        // a block with no commanded feed ran at the machine's limit; count it as commanded
        this.cuttingCommandedS += f > 0 ? (lengthMm * 60) / f : durationS;
      }
    }
  }

  /** A record that takes a fixed time (dwell, tool change, spin-up) or none (stops). */
  record(move: number, kind: number, durationS: number): void {
    if (this.nextMove <= move) this.catchUp(move);
    this.totalS += durationS;
    this.cumulativeS[move] = this.totalS;
    this.byKind[kind] += durationS;
    if (durationS > 0) this.tally(move).seconds += durationS;
  }

  /** Closes the clock: moves after the last timed one end at the total. */
  finish(): void {
    this.catchUp(this.cumulativeS.length);
  }

  toolTotals(): ToolTally[] {
    return [...this.tools.values()].filter((t) => t.seconds > 0 || t.feedDistanceMm > 0).sort((a, b) => a.tool - b.tool);
  }
}
