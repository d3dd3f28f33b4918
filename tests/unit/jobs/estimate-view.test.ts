// The job page's summaries of a stored report, checked against the report the CLI prints for
// fixtures/programs/shelf-brackets-birch-18mm.nc on fixtures/machines/router-1.json (the same
// runEstimate the server stores, lib/estimate/run-estimate.ts): the counts must equal the
// report's own checks.errors/warnings/infos, and the parts' held-by groups must add up to the
// report's checks.parts, partsHeld and partsUnheld.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadAnalysis } from '@/lib/analysis';
import { runEstimate } from '@/lib/estimate/run-estimate';
import { countFindings, holdSentence, pollInterval, summarizeParts, type ReportView } from '@/lib/jobs/estimate-view';
import { parseMachineProfile } from '@/lib/validation/machine-profile';

const root = path.resolve(__dirname, '../../..');
let report: ReportView & { checks: { errors: number; warnings: number; infos: number; parts: number; partsHeld: number; partsUnheld: number } };

beforeAll(async () => {
  await loadAnalysis();
  const parsed = parseMachineProfile(JSON.parse(readFileSync(path.join(root, 'fixtures/machines/router-1.json'), 'utf8')));
  if (!parsed.ok) throw new Error(parsed.message);
  const text = readFileSync(path.join(root, 'fixtures/programs/shelf-brackets-birch-18mm.nc'), 'utf8');
  const run = runEstimate(text, parsed.profile, { sheet: { widthMm: 1220, lengthMm: 2440, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 61 }, { name: 'shelf-brackets-birch-18mm.nc', sha256: '0'.repeat(64) });
  report = JSON.parse(JSON.stringify(run.report));
});

describe('countFindings', () => {
  it("takes the report's own counts, which include the findings counted but not listed", () => {
    const counts = countFindings(report);
    expect(counts).toMatchObject({ errors: report.checks.errors, warnings: report.checks.warnings, notes: report.checks.infos });
    expect(counts.errors + counts.warnings + counts.notes - counts.unlisted).toBe(report.findings.length);
  });

  it('counts the listed findings when the report has no checks', () => {
    const findings = [
      { kind: 'a', severity: 'error' as const, line: 3, message: 'x' },
      { kind: 'b', severity: 'info' as const, line: 0, message: 'y' },
      { kind: 'c', severity: 'info' as const, line: 9, message: 'z' },
    ];
    expect(countFindings({ ...report, checks: undefined, findings })).toEqual({ errors: 1, warnings: 0, notes: 2, unlisted: 0 });
  });
});

describe('summarizeParts', () => {
  it("adds up to the report's part counts", () => {
    const summary = summarizeParts(report.parts);
    expect(summary.count).toBe(report.checks.parts);
    expect(summary.unheld).toBe(report.checks.partsUnheld);
    expect(summary.groups.filter((g) => g.held).reduce((n, g) => n + g.count, 0)).toBe(report.checks.partsHeld);
  });

  it('puts parts held by nothing first and words the summary', () => {
    const part = report.parts[0];
    const parts = [
      { ...part, held: true, holdBy: 'vacuum' as const },
      { ...part, held: true, holdBy: 'vacuum' as const },
      { ...part, held: false, holdBy: 'none' as const },
      { ...part, held: true, holdBy: 'tabs' as const },
    ];
    expect(holdSentence(summarizeParts(parts))).toBe('4 parts: 1 held by nothing, 2 held by the vacuum, 1 held by tabs.');
    expect(holdSentence(summarizeParts([]))).toBe('No parts cut free of the sheet were found.');
  });
});

describe('pollInterval', () => {
  it('polls only while the estimate waits or runs', () => {
    expect(pollInterval('pending')).toBeGreaterThan(0);
    expect(pollInterval('running')).toBeGreaterThan(0);
    expect(pollInterval('done')).toBe(0);
    expect(pollInterval('failed')).toBe(0);
  });
});
