// Human-readable output of `npm run estimate`: a short plain-text table of the same report
// --json prints. Words, not codes: hold-downs by their labels, counts with their plurals, each
// finding's line shown once beside its sentence.
import type { AnalysisPart, AnalysisSummary } from '@/lib/analysis';
import type { EstimateReport, ReportFinding } from '@/lib/kinematics';
import { HOLD_DOWN_LABELS } from '@/lib/validation/enums';

export function clock(seconds: number): string {
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const ss = String(s % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

/** "1 hole", "2 holes", "0 holes" */
export function count(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

const metres = (mm: number) => `${(mm / 1000).toFixed(2)} m`;
const SHOWN = 10;

type Checks = Pick<AnalysisSummary, 'holdDown' | 'vacuumKpa' | 'suppressed'> & { holdDownAssumed: boolean };

/** what holds a part, worded as a finding: never "held" alone */
export function partVerdict(p: AnalysisPart): string {
  if (!p.held) return 'not held (see the findings)';
  switch (p.holdBy) {
    case 'tabs':
      return `no hold problem found (${count(p.tabs, 'tab')} left by the program)`;
    case 'skin':
      return `no hold problem found (onion skin ${p.skinMm.toFixed(2)} mm left by the program)`;
    case 'vacuum':
      return 'no hold problem found (enough area for the vacuum)';
    case 'tape-glue':
      return 'counted as held (tape and glue assumed)';
    default:
      return 'no hold problem found';
  }
}

export function holdDownText(c: Checks | undefined): string {
  if (!c || c.holdDownAssumed || c.holdDown === null) return 'No hold-down was given, so only tabs or onion skin left by the program count.';
  const label = HOLD_DOWN_LABELS[c.holdDown];
  return c.holdDown === 'vacuum' && c.vacuumKpa !== null ? `${label} at ${c.vacuumKpa} kPa` : label;
}

function findingRows(findings: readonly ReportFinding[], suppressed: number): [string, string][] {
  const rows: [string, string][] = [];
  const errors = findings.filter((f) => f.severity === 'error').length;
  const warnings = findings.filter((f) => f.severity === 'warning').length;
  const infos = findings.length - errors - warnings;
  rows.push(['findings', findings.length === 0 ? 'none' : `${findings.length}: ${count(errors, 'error')}, ${count(warnings, 'warning')}, ${infos} info`]);
  const rank = { error: 0, warning: 1, info: 2 } as const;
  const worstFirst = [...findings].sort((a, b) => rank[a.severity] - rank[b.severity] || a.line - b.line);
  for (const f of worstFirst.slice(0, SHOWN)) rows.push([f.line > 0 ? `  line ${f.line}` : '  whole program', `${f.severity}: ${f.message}`]);
  if (findings.length > SHOWN) rows.push(['', `… ${findings.length - SHOWN} more listed in --json`]);
  if (suppressed > 0) rows.push(['', `${count(suppressed, 'further finding')} of kinds already listed ${suppressed === 1 ? 'was' : 'were'} counted, not listed`]);
  return rows;
}

export function formatEstimateTable(r: EstimateReport, machineName: string, timeFactor: number): string {
  const rows: [string, string][] = [];
  const total = r.totalSeconds;
  const share = (s: number) => (total > 0 ? `${((100 * s) / total).toFixed(1).padStart(5)} %` : '');
  rows.push(['program', `${r.file.name}: ${count(r.file.lines, 'line')}, ${r.file.units}, sha256 ${r.file.sha256.slice(0, 12)}…`]);
  rows.push(['machine', machineName]);
  rows.push(['total', `${clock(total)}  (${total.toFixed(1)} s)`]);
  rows.push(['calibrated', `${clock(r.calibratedSeconds)}  (time factor ${timeFactor})`]);
  const b = r.breakdownSeconds;
  rows.push(['time by kind', `${'time'.padStart(8)}  ${'share'.padStart(7)}`]);
  const kinds: [string, number][] = [
    ['  cutting', b.cutting],
    ['  air moves', b.air],
    ['  rapids', b.rapid],
    ['  plunges', b.plunge],
    ['  dwells', b.dwell],
    ['  tool changes', b.toolChange],
    ['  spindle spin-up', b.spindle],
  ];
  for (const [k, s] of kinds) rows.push([k, `${clock(s).padStart(8)}  ${share(s)}`]);
  rows.push(['program stops', `${r.programStops} (M0/M1 are counted, not timed)`]);
  rows.push(['distance', `feed ${metres(r.distanceMm.feed)}, rapid ${metres(r.distanceMm.rapid)}`]);
  if (r.tools.length > 0) {
    rows.push(['time by tool', `${'time'.padStart(8)}  feed distance`]);
    for (const t of r.tools) rows.push([`  T${t.tool}${t.tool === 0 ? ' (none)' : ''}`, `${clock(t.seconds).padStart(8)}  ${metres(t.feedDistanceMm)}`]);
  }
  if (r.cuttingFeed.commandedMmPerMin > 0) {
    const f = r.cuttingFeed;
    rows.push(['cutting feed', `commanded ${Math.round(f.commandedMmPerMin)} mm/min, achieved ${Math.round(f.achievedMmPerMin)} mm/min (${(100 * f.lostShare).toFixed(1)} % of cutting time lost to acceleration and limits)`]);
  }
  const checks = r.checks as Checks | undefined;
  rows.push(['hold-down', holdDownText(checks)]);
  const parts = r.parts as AnalysisPart[];
  const unheld = parts.filter((p) => !p.held).length;
  rows.push(['parts', parts.length === 0
    ? 'no through-cut parts found'
    : `${count(parts.length, 'through-cut part')}, ${unheld === 0 ? 'no hold problem found' : `${unheld} not held`}`]);
  for (const p of [...parts].sort((a, b) => a.order - b.order).slice(0, SHOWN)) {
    const freed = p.freedAtLine === null ? 'stays attached' : `freed at line ${p.freedAtLine}`;
    rows.push([`  #${p.order} part ${p.id}`, `${Math.round(p.areaMm2)} mm², ${count(p.holes, 'hole')}, ${count(p.tabs, 'tab')}, ${freed}: ${partVerdict(p)}`]);
  }
  if (parts.length > SHOWN) rows.push(['', `… ${parts.length - SHOWN} more listed in --json`]);
  const suppressed = Object.values(checks?.suppressed ?? {}).reduce((a, n) => a + (n ?? 0), 0);
  rows.push(...findingRows(r.findings, suppressed));
  const w = Math.max(...rows.map(([k]) => k.length)) + 2;
  const lines = rows.map(([k, v]) => `${k.padEnd(w)}${v}`);
  lines.push('', 'An estimate and a check are aids, not a guarantee: the machine’s manual, the shop’s safety rules and a trained operator decide.');
  return lines.join('\n');
}
