// Public face of the estimating engine: move list + machine profile → timed moves and estimate.
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
