// Result and options of a run-time estimate. Lengths mm, times s, feeds mm/min.

export interface EstimateBreakdown {
  /** feed moves with any part below the stock top */
  cutting: number;
  /** feed moves wholly at or above the stock top */
  air: number;
  rapid: number;
  /** feed moves going down more steeply than 45° */
  plunge: number;
  dwell: number;
  toolChange: number;
  /** spindle spin-up from stopped */
  spindle: number;
}

export interface ToolSeconds {
  tool: number;
  /** every second spent with this tool in the spindle, its tool change included */
  seconds: number;
  /** feed (non-rapid) distance cut or travelled with it, mm */
  feedDistanceMm: number;
}

export interface CuttingFeed {
  distanceMm: number;
  seconds: number;
  /** the feed the program asked for, averaged over the cutting distance: distance / Σ(length/F) */
  commandedMmPerMin: number;
  /** distance / seconds actually taken */
  achievedMmPerMin: number;
  /** share of cutting time lost to acceleration, cornering and controller limits: 1 − achieved/commanded */
  lostShare: number;
}

export interface Estimate {
  totalSeconds: number;
  /** totalSeconds × the profile's timeFactor */
  calibratedSeconds: number;
  breakdownSeconds: EstimateBreakdown;
  /** M0/M1: counted, no time */
  programStops: number;
  /** records in the move list */
  moves: number;
  /** planner blocks (arcs count one per chord) */
  blocks: number;
  distanceMm: { feed: number; rapid: number };
  tools: ToolSeconds[];
  cuttingFeed: CuttingFeed;
  /** clock at the end of every move, s (non-decreasing; see moveAtTime) */
  cumulativeS: Float64Array;
  /** most blocks the planner held at once, and the bytes of its ring at the end */
  plannerPeakBlocks: number;
  plannerBytes: number;
  /** true when the signal stopped the estimate early; the figures cover the moves done */
  cancelled: boolean;
}

export interface EstimateOptions {
  /** Z of the stock top in the work frame: 0 when Z zero is the top, T when it is the table (default 0) */
  stockTopZ?: number;
  /** called every `progressEvery` moves with (movesDone, totalMoves) */
  onProgress?: (done: number, total: number) => void;
  progressEvery?: number;
  signal?: { readonly aborted: boolean };
}
