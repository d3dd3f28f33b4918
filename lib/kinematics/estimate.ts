// Run-time estimate of a move list on a machine profile.
//
// Motion model (tests/unit/kinematics pin it; sources in the modules named):
// - F is the feed along the path (RS274/NGC, NISTIR 6556 §2.1.2.5). A feed block's speed limit
//   is min(F, min over moving axes of maxFeedMmPerMin_i/|u_i|), a rapid's min over moving axes
//   of rapidMmPerMin_i/|u_i| (straight-line rapid); its acceleration min over moving axes of
//   accelMmPerS2_i/|u_i| (axis-limits.ts). A feed move with no F runs at the axis limits.
// - Trapezoidal (constant-acceleration) profiles (trapezoid.ts, Biagiotti & Melchiorri §3.2.2).
//   The program starts at the move list's start point and at rest, and ends at rest; so does
//   every tool change, spindle start or stop, dwell, program stop or end, and every move run
//   under G61 (exact stop).
// - Corners by the corner tolerance δ (corner-speed.ts: plane geometry of a circle inscribed in
//   the corner, and a = v²/R of uniform circular motion): v = √(a·δ·sin(θ/2)/(1 − sin(θ/2))),
//   capped by both blocks' limits; straight on keeps speed, a reversal stops.
// - Arcs are flattened to chords within chordToleranceMm (arc-chords.ts, block-feed.ts); each chord is a block,
//   capped also by √(a·r), a the smaller acceleration limit of the arc plane's two axes.
//   Chords are timed and counted at the arc's own length (helix length on a helix: F is
//   along the path, NISTIR 6556 §2.1.2.5), their directions are the chords'.
// - Look-ahead of N blocks (planner.ts): the planner only uses speed from which it could still
//   stop within the N blocks it holds, as if the program ended N blocks ahead. Block rate R:
//   a block's speed is capped at length·R so that it lasts at least 1/R s. lookaheadBlocks 0
//   and maxBlocksPerS 0 mean unlimited.
// - Time = Σ block times + toolChangeSeconds per M6 + spindleSpinUpSeconds per M3/M4 from
//   stopped + dwell P. M0/M1 are counted as program stops with no time.
//   calibratedSeconds = total × timeFactor.
// - Breakdown: rapid; feed blocks are plunge when going down more steeply than 45°, else
//   cutting when any part lies below the stock top, else air. The 45° line is our own,
//   neither sourced nor computed (common practice: ramps enter at a few degrees, plunges
//   straight down; docs/references.md).

import { MoveFlag, MoveKind, type MoveList } from '../gcode/move-list';
import type { MachineProfile } from '../validation/machine-profile';
import { BlockFeed } from './block-feed';
import { BlockPlanner } from './planner';
import { TimeKind, Timeline } from './timeline';
import type { Estimate, EstimateOptions } from './types';

// Local copies: loaders may turn imported bindings into getters, which costs in the loop.
const K_RAPID = MoveKind.rapid;
const K_FEED = MoveKind.feed;
const K_ARC = MoveKind.arc;
const EXACT_STOP = MoveFlag.exactStop;

export function estimate(moves: MoveList, profile: MachineProfile, options: EstimateOptions = {}): Estimate {
  const timeline = new Timeline(moves);
  const planner = new BlockPlanner(timeline, profile.lookaheadBlocks, profile.accelMmPerS2, profile.cornerToleranceMm);
  const feedBlocks = new BlockFeed(planner, profile, options.stockTopZ ?? 0, { x: moves.startX, y: moves.startY, z: moves.startZ });
  const { x, y, z, kind, flags, feed, aux, arcs } = moves;
  const count = moves.count;
  const every = options.progressEvery && options.progressEvery > 0 ? options.progressEvery : 65536;
  let nextReport = every;
  let programStops = 0;
  let arcRow = 0;
  let cancelled = false;

  for (let i = 0; i < count; i++) {
    if (i >= nextReport) {
      nextReport += every;
      options.onProgress?.(i, count);
      if (options.signal?.aborted) {
        cancelled = true;
        break;
      }
    }
    const moveKind = kind[i];
    if (moveKind === K_RAPID || moveKind === K_FEED) {
      feedBlocks.line(i, moveKind === K_RAPID, x[i], y[i], z[i], feed[i] / 60, Infinity, 1);
      if (flags[i] & EXACT_STOP) planner.flush();
    } else if (moveKind === K_ARC) {
      while (arcRow < arcs.count && arcs.move[arcRow] < i) arcRow++;
      if (arcRow < arcs.count && arcs.move[arcRow] === i) feedBlocks.arc(i, arcs, arcRow, x[i], y[i], z[i], feed[i] / 60);
      else feedBlocks.line(i, false, x[i], y[i], z[i], feed[i] / 60, Infinity, 1); // no arc row: run as a chord
      if (flags[i] & EXACT_STOP) planner.flush();
    } else {
      planner.flush();
      if (moveKind === MoveKind.dwell) timeline.record(i, TimeKind.dwell, aux[i] > 0 ? aux[i] : 0);
      else if (moveKind === MoveKind.toolChange) timeline.record(i, TimeKind.toolChange, profile.toolChangeSeconds);
      else if (moveKind === MoveKind.spindleStart) timeline.record(i, TimeKind.spindle, profile.spindleSpinUpSeconds);
      else {
        if (moveKind === MoveKind.programStop) programStops++;
        timeline.record(i, TimeKind.none, 0);
      }
      feedBlocks.px = x[i];
      feedBlocks.py = y[i];
      feedBlocks.pz = z[i];
    }
  }
  planner.flush();
  timeline.finish();
  if (!cancelled) options.onProgress?.(count, count);
  return estimateFigures(timeline, planner, profile, count, programStops, cancelled);
}

/** the Estimate from the finished clock: totals by kind, distances, tools and the cutting feed */
function estimateFigures(timeline: Timeline, planner: BlockPlanner, profile: MachineProfile, count: number, programStops: number, cancelled: boolean): Estimate {
  const b = timeline.byKind;
  const cuttingS = b[TimeKind.cutting];
  const dist = timeline.cuttingDistanceMm;
  const commanded = timeline.cuttingCommandedS > 0 ? (dist * 60) / timeline.cuttingCommandedS : 0;
  const achieved = cuttingS > 0 ? (dist * 60) / cuttingS : 0;
  const total = timeline.totalS;
  return {
    totalSeconds: total,
    calibratedSeconds: total * profile.timeFactor,
    breakdownSeconds: {
      cutting: cuttingS,
      air: b[TimeKind.air],
      rapid: b[TimeKind.rapid],
      plunge: b[TimeKind.plunge],
      dwell: b[TimeKind.dwell],
      toolChange: b[TimeKind.toolChange],
      spindle: b[TimeKind.spindle],
    },
    programStops,
    moves: count,
    blocks: timeline.blocks,
    distanceMm: { feed: timeline.feedDistanceMm, rapid: timeline.rapidDistanceMm },
    tools: timeline.toolTotals(),
    cuttingFeed: {
      distanceMm: dist,
      seconds: cuttingS,
      commandedMmPerMin: commanded,
      achievedMmPerMin: achieved,
      lostShare: commanded > 0 && achieved > 0 ? Math.max(0, 1 - achieved / commanded) : 0,
    },
    cumulativeS: timeline.cumulativeS,
    plannerPeakBlocks: planner.peakBlocks,
    plannerBytes: planner.bytes,
    cancelled,
  };
}
