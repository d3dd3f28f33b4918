// Whether the browser worker's report is the stored one: the whole JSON compared as the CLI
// writes it (same code and same inputs give the same bytes), and, when not, which of the
// figures a reader checks first differ, in words.
import type { EstimateReport } from '@/lib/kinematics/estimate-report';

export interface ReportComparison {
  identical: boolean;
  differences: string[];
}

const FIGURES: { label: string; read: (r: EstimateReport) => unknown }[] = [
  { label: 'engine version', read: (r) => r.engine },
  { label: 'file SHA-256', read: (r) => r.file.sha256 },
  { label: 'total time (s)', read: (r) => r.totalSeconds },
  { label: 'calibrated time (s)', read: (r) => r.calibratedSeconds },
  { label: 'time by kind', read: (r) => JSON.stringify(r.breakdownSeconds) },
  { label: 'moves', read: (r) => r.moves },
  { label: 'distances', read: (r) => JSON.stringify(r.distanceMm) },
  { label: 'findings', read: (r) => r.findings.length },
  { label: 'parts', read: (r) => r.parts.length },
];

export function compareReports(stored: EstimateReport, viewed: EstimateReport): ReportComparison {
  if (JSON.stringify(stored) === JSON.stringify(viewed)) return { identical: true, differences: [] };
  const differences = FIGURES.filter((f) => f.read(stored) !== f.read(viewed)).map((f) => `${f.label}: stored ${String(f.read(stored))}, this view ${String(f.read(viewed))}`);
  if (differences.length === 0) differences.push('the figures above agree; a finding, part or detail further down the report differs');
  return { identical: false, differences };
}
