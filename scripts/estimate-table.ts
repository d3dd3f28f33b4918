// Human-readable output of `npm run estimate`: a short plain-text table.
import type { AnalysisPart } from '@/lib/analysis';
import type { EstimateReport } from '@/lib/kinematics';

export function clock(seconds: number): string {
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const ss = String(s % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

const metres = (mm: number) => `${(mm / 1000).toFixed(2)} m`;

export function formatEstimateTable(r: EstimateReport, machineName: string, timeFactor: number): string {
  const rows: [string, string][] = [];
  const total = r.totalSeconds;
  const share = (s: number) => (total > 0 ? `${((100 * s) / total).toFixed(1).padStart(5)} %` : '');
  rows.push(['program', `${r.file.name}  ${r.file.lines} lines, ${r.file.units}, sha256 ${r.file.sha256.slice(0, 12)}…`]);
  rows.push(['machine', machineName]);
  rows.push(['total', `${clock(total)}  (${total.toFixed(1)} s)`]);
  rows.push(['calibrated', `${clock(r.calibratedSeconds)}  (time factor ${timeFactor})`]);
  const b = r.breakdown;
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
  rows.push(['program stops', `${r.programStops} (M0/M1, not timed)`]);
  rows.push(['distance', `feed ${metres(r.distance.feed)}, rapid ${metres(r.distance.rapid)}`]);
  for (const t of r.tools) rows.push([`  T${t.tool}${t.tool === 0 ? " (none)" : ""}`, `${clock(t.seconds).padStart(8)}  feed ${metres(t.feedDistance)}`]);
  if (r.cuttingFeed.commanded > 0) {
    rows.push(['cutting feed', `commanded ${Math.round(r.cuttingFeed.commanded)} mm/min, achieved ${Math.round(r.cuttingFeed.achieved)} mm/min (${(100 * r.cuttingFeed.lostShare).toFixed(1)} % of cutting time lost to acceleration and limits)`]);
  }
  const parts = r.parts as AnalysisPart[];
  const unheld = parts.filter((p) => !p.held).length;
  rows.push(['parts', parts.length === 0 ? 'no through-cut parts found' : `${parts.length} through-cut (${unheld} not held)`]);
  for (const p of [...parts].sort((a, b) => a.order - b.order).slice(0, 10)) {
    const held = p.held ? `held by ${p.holdBy}` : 'NOT HELD';
    const freed = p.freedAtLine === null ? 'stays attached' : `freed at line ${p.freedAtLine}`;
    rows.push([`  #${p.order} part ${p.id}`, `${Math.round(p.areaMm2)} mm², ${p.holes} holes, ${p.tabs} tabs, ${held}, ${freed}`]);
  }
  if (parts.length > 10) rows.push(['', `… ${parts.length - 10} more (use --json)`]);
  const errors = r.findings.filter((f) => f.severity === 'error').length;
  const warnings = r.findings.filter((f) => f.severity === 'warning').length;
  rows.push(['findings', `${r.findings.length} (${errors} errors, ${warnings} warnings)`]);
  const rank = { error: 0, warning: 1, info: 2 } as const;
  const worstFirst = [...r.findings].sort((a, b) => rank[a.severity] - rank[b.severity] || a.line - b.line);
  for (const f of worstFirst.slice(0, 10)) rows.push([`  line ${f.line}`, `${f.severity}: ${f.message}`]);
  if (r.findings.length > 10) rows.push(['', `… ${r.findings.length - 10} more (use --json)`]);
  const w = Math.max(...rows.map(([k]) => k.length)) + 2;
  const lines = rows.map(([k, v]) => `${k.padEnd(w)}${v}`);
  lines.push('', 'An estimate and a check are aids, not a guarantee: the machine’s manual, the shop’s safety rules and a trained operator decide.');
  return lines.join('\n');
}
