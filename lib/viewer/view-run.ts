// One program opened in the viewer: the browser worker's whole job, kept out of the worker
// file so it is tested in Node. Bytes → the same checks as an upload (lib/gcode program-text)
// → SHA-256 → runEstimate (interpret, plan, through-cut checks: the server's and the CLI's
// code) → the path buffers → the result, whose every per-move array goes back transferred.
// The report's plunge points (about 150,000 objects on a big nest) cross as columns too: the
// page would otherwise spend a long task rebuilding every object on arrival. The report still
// reads as before (checks.plungePoints builds the objects when first read, in the same place
// of the JSON), so the program page's comparison with the stored report is unchanged.
import { loadAnalysis } from '@/lib/analysis';
import type { PlungePoint } from '@/lib/analysis/types';
import { runEstimate, type EstimateJob } from '@/lib/estimate/run-estimate';
import { checkProgramBytes } from '@/lib/gcode/program-text';
import type { ArcTable, MoveList } from '@/lib/gcode/move-list';
import type { EstimateReport } from '@/lib/kinematics/estimate-report';
import { stockTopZ } from '@/lib/kinematics/stock-top';
import type { MachineProfile } from '@/lib/validation/machine-profile';
import { lineStarts } from './line-index';
import { buildViewerPath, pathTransferables, type ViewerPath } from './path-build';

export interface ViewerInput {
  name: string;
  profile: MachineProfile;
  job: EstimateJob;
}

export interface ViewerProgress {
  /** 0–100 */
  percent: number;
  /** what is being done, in words */
  stage: string;
}

export interface ViewerResult {
  report: EstimateReport;
  moves: MoveList;
  cumulativeS: Float64Array;
  path: ViewerPath;
  /** byte offsets of the source lines (line-index.ts) */
  lineStarts: Uint32Array;
  stockTopZ: number;
  /** the report's checks.plungePoints, in columns */
  plunges: PlungeColumns;
  sha256: string;
  timingsMs: { read: number; engine: number; path: number };
}

export class ViewerInputError extends Error {}

/** plunge points in columns, index i of each column being point i */
export interface PlungeColumns {
  count: number;
  line: Int32Array;
  tool: Int32Array;
  /** bit 0 ramp, bit 1 rapid */
  flags: Uint8Array;
  x: Float64Array;
  y: Float64Array;
  depthMm: Float64Array;
  feedMmPerMin: Float64Array;
}

export function packPlungePoints(points: readonly PlungePoint[]): PlungeColumns {
  const n = points.length;
  const c: PlungeColumns = {
    count: n,
    line: new Int32Array(n),
    tool: new Int32Array(n),
    flags: new Uint8Array(n),
    x: new Float64Array(n),
    y: new Float64Array(n),
    depthMm: new Float64Array(n),
    feedMmPerMin: new Float64Array(n),
  };
  for (let i = 0; i < n; i++) {
    const p = points[i];
    c.line[i] = p.line;
    c.tool[i] = p.tool;
    c.flags[i] = (p.ramp ? 1 : 0) | (p.rapid ? 2 : 0);
    c.x[i] = p.x;
    c.y[i] = p.y;
    c.depthMm[i] = p.depthMm;
    c.feedMmPerMin[i] = p.feedMmPerMin;
  }
  return c;
}

/** the objects back, their keys in the analysis's order (lib/analysis PlungePoints.at) */
export function unpackPlungePoints(c: PlungeColumns): PlungePoint[] {
  const out: PlungePoint[] = new Array(c.count);
  for (let i = 0; i < c.count; i++) {
    const f = c.flags[i];
    out[i] = { line: c.line[i], x: c.x[i], y: c.y[i], depthMm: c.depthMm[i], feedMmPerMin: c.feedMmPerMin[i], tool: c.tool[i], ramp: (f & 1) !== 0, rapid: (f & 2) !== 0 };
  }
  return out;
}

/** report.checks.plungePoints as a getter over the columns, built on first read, in its place */
function attachPlungePoints(report: EstimateReport, columns: PlungeColumns): void {
  const checks = report.checks as Record<string, unknown> | undefined;
  if (!checks || !('plungePoints' in checks)) return;
  let list: PlungePoint[] | null = null;
  // redefining the existing key keeps its place in the key order, so JSON.stringify is unchanged
  Object.defineProperty(checks, 'plungePoints', {
    enumerable: true,
    configurable: true,
    get: () => (list ??= unpackPlungePoints(columns)),
    set: (v: PlungePoint[]) => {
      list = v;
    },
  });
}

function hex(buffer: ArrayBuffer): string {
  return Array.from(new Uint8Array(buffer), (b) => b.toString(16).padStart(2, '0')).join('');
}

/** share of the bar each stage takes (rough shares of the time on the generated nest) */
const BAR = { read: 3, interpret: 55, plan: 20, checks: 17, path: 5 } as const;

export async function openProgram(bytes: Uint8Array, input: ViewerInput, onProgress: (p: ViewerProgress) => void): Promise<ViewerResult> {
  const t0 = performance.now();
  const checked = checkProgramBytes(bytes);
  if (!checked.ok) throw new ViewerInputError(`This file cannot be shown: ${checked.message}`);
  const sha256 = hex(await crypto.subtle.digest('SHA-256', bytes as Uint8Array<ArrayBuffer>));
  const starts = lineStarts(bytes);
  await loadAnalysis();
  onProgress({ percent: BAR.read, stage: 'Reading the program' });
  const t1 = performance.now();
  let last = -1;
  const report = (percent: number, stage: string) => {
    const p = Math.floor(percent);
    if (p !== last) {
      last = p;
      onProgress({ percent: p, stage });
    }
  };
  const run = runEstimate(
    checked.text,
    input.profile,
    input.job,
    { name: input.name, sha256 },
    (stage) => {
      if (stage === 'interpreted') report(BAR.read + BAR.interpret, 'Planning the motion');
      else if (stage === 'planned') report(BAR.read + BAR.interpret + BAR.plan, 'Checking through-cuts and hold-down');
      else report(100 - BAR.path, 'Building the path');
    },
    {
      onLines: (done, total) => report(BAR.read + (BAR.interpret * done) / Math.max(1, total), 'Reading the G-code'),
      onMoves: (done, total) => report(BAR.read + BAR.interpret + (BAR.plan * done) / Math.max(1, total), 'Planning the motion'),
    },
  );
  const t2 = performance.now();
  const topZ = stockTopZ(input.job.zero, input.job.sheet?.thicknessMm);
  const findingLines = Uint32Array.from(new Set(run.report.findings.map((f) => f.line).filter((l) => l > 0))).sort();
  const path = buildViewerPath(run.interpretation.moves, run.estimate.cumulativeS, {
    stockTopZ: topZ,
    chordToleranceMm: input.profile.chordToleranceMm,
    findingLines,
  });
  const checks = run.report.checks as { plungePoints?: PlungePoint[] } | undefined;
  const plunges = checks?.plungePoints ? packPlungePoints(checks.plungePoints) : packPlungePoints([]);
  attachPlungePoints(run.report, plunges);
  const t3 = performance.now();
  onProgress({ percent: 100, stage: 'Drawing' });
  return {
    report: run.report,
    plunges,
    moves: run.interpretation.moves,
    cumulativeS: run.estimate.cumulativeS,
    path,
    lineStarts: starts,
    stockTopZ: topZ,
    sha256,
    timingsMs: { read: Math.round(t1 - t0), engine: Math.round(t2 - t1), path: Math.round(t3 - t2) },
  };
}

function arcBuffers(a: ArcTable): ArrayBuffer[] {
  return [a.move, a.cx, a.cy, a.cz, a.radius, a.sweep, a.plane].map((x) => x.buffer as ArrayBuffer);
}

/** the report's lists that cross in chunks, each chunk its own message (its own short task on the page) */
const CHUNKED = ['parts', 'findings'] as const;
export const TRANSFER_CHUNK = 1000;

export interface ReportChunk {
  key: (typeof CHUNKED)[number];
  items: unknown[];
}

/**
 * The result as the worker posts it: the same, but the report's plunge points left as null
 * (a structured clone would read the getter and send every object; fromTransfer puts the
 * getter back on the page's side), and its parts and findings left empty, to be sent before
 * it in chunks of TRANSFER_CHUNK: the page takes one message at a time, and one message of
 * 9,000 parts kept it busy for over 100 ms.
 */
export function forTransfer(r: ViewerResult): { result: ViewerResult; chunks: ReportChunk[] } {
  const chunks: ReportChunk[] = [];
  const report = { ...r.report };
  for (const key of CHUNKED) {
    const list = report[key] as unknown[];
    for (let i = 0; i < list.length; i += TRANSFER_CHUNK) chunks.push({ key, items: list.slice(i, i + TRANSFER_CHUNK) });
    // the key stays where it was, so the page's report keeps the CLI's key order
    (report as Record<string, unknown>)[key] = [];
  }
  const checks = r.report.checks as Record<string, unknown> | undefined;
  if (checks && 'plungePoints' in checks) {
    const sent: Record<string, unknown> = {};
    for (const key of Object.keys(checks)) sent[key] = key === 'plungePoints' ? null : checks[key];
    report.checks = sent as EstimateReport['checks'];
  }
  return { result: { ...r, report }, chunks };
}

/** the page's side of forTransfer: the chunks, in the order they came, back in their lists */
export function fromTransfer(r: ViewerResult, chunks: readonly ReportChunk[]): ViewerResult {
  const lists: Record<string, unknown[]> = {};
  for (const c of chunks) {
    const list = (lists[c.key] ??= []);
    for (const item of c.items) list.push(item);
  }
  const report = r.report as unknown as Record<string, unknown>;
  for (const key of CHUNKED) if (lists[key]) report[key] = lists[key];
  attachPlungePoints(r.report, r.plunges);
  return r;
}

function plungeBuffers(c: PlungeColumns): ArrayBuffer[] {
  return [c.line, c.tool, c.flags, c.x, c.y, c.depthMm, c.feedMmPerMin].map((x) => x.buffer as ArrayBuffer);
}

/** every typed array of the result once, for the transfer list (shared buffers listed once) */
export function resultTransferables(r: ViewerResult): ArrayBuffer[] {
  const m = r.moves;
  const all = [
    ...[m.x, m.y, m.z, m.kind, m.flags, m.tool, m.feed, m.spindle, m.aux, m.line].map((x) => x.buffer as ArrayBuffer),
    ...arcBuffers(m.arcs),
    r.cumulativeS.buffer as ArrayBuffer,
    r.lineStarts.buffer as ArrayBuffer,
    ...pathTransferables(r.path),
    ...plungeBuffers(r.plunges),
  ];
  return [...new Set(all)];
}
