// Public face of the estimating engine: move list + machine profile → timed moves and estimate.
//
// The stages of estimate(), streamed move by move:
//
// | stage              | module                                    | input                          | output                                   |
// |--------------------|-------------------------------------------|--------------------------------|------------------------------------------|
// | 1 blocks           | block-feed.ts, arc-chords.ts, axis-limits.ts | MoveList, MachineProfile    | straight blocks with feed and axis caps  |
// | 2 look-ahead       | planner.ts, corner-speed.ts               | blocks                         | entry and exit speeds per block          |
// | 3 block times      | trapezoid.ts                              | a block's length and speeds    | its duration, s                          |
// | 4 clock            | timeline.ts                               | block times by move            | cumulativeS, seconds by kind and tool    |
// | 5 estimate         | estimate.ts → types.ts                    | the clock and totals           | Estimate                                 |
// | 6 report           | estimate-report.ts                        | Estimate, diagnostics, checks  | EstimateReport (the stored JSON)         |
// | playback           | move-at-time.ts                           | cumulativeS, a time            | the move running then                    |
export { ENGINE_VERSION } from './version';
export { estimate } from './estimate';
export { moveAtTime } from './move-at-time';
export { stockTopZ, type ZeroAt } from './stock-top';
export { blockDurationS, restToRestDurationS } from './trapezoid';
export { cornerSpeedLimit, cornerSpeedForAngle } from './corner-speed';
export { limitAlong } from './axis-limits';
export { chordCount } from './arc-chords';
export { buildEstimateReport, type EstimateReport, type ReportFinding, type ReportInput } from './estimate-report';
export type { Estimate, EstimateBreakdown, EstimateOptions, ToolSeconds, CuttingFeed } from './types';
