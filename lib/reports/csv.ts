// The CSV exports' columns and text: one record per run or estimate, written with
// csv-stringify in RFC 4180 form (comma-separated, CRLF between records, a field holding a
// comma, a double quote or a line break enclosed in double quotes with its quotes doubled,
// RFC 4180 §2 rules 1, 6 and 7; a header record first, §2 rule 3). Instants are ISO 8601 in
// UTC, durations in seconds, ratios to 4 decimals. A text field that begins with =, +, -, @,
// a tab or a carriage return gets a leading ' (csv-stringify's escape_formulas), so a
// spreadsheet opening the file does not run a note typed as a formula (OWASP, "CSV Injection").
// Pure: the route handlers feed it one batch of rows at a time, so an export is streamed.
import { stringify } from 'csv-stringify/sync';
import { runRatio } from '@/lib/runs/calibration';
import { runStanding, type RunStanding } from './run-stats';

export interface CsvColumn<T> {
  header: string;
  value: (row: T) => string | number | boolean | null;
}

const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString());
const fixed = (v: number | null, digits: number) => (v === null ? null : Number(v.toFixed(digits)));

/** One run row as the export reads it (db/queries/run-reports.ts). */
export interface RunExportRow {
  id: number;
  jobId: number;
  jobTitle: string;
  programName: string;
  programVersion: number;
  machineName: string;
  machineVersion: number;
  operatorName: string;
  status: string;
  startedAt: Date | string;
  finishedAt: Date | string | null;
  sheetsCut: number | null;
  /** the uncalibrated estimate for the sheets cut (lib/runs/run-estimate.ts) */
  estimatedSeconds: number | null;
  actualSeconds: number | null;
  interrupted: boolean;
  voided: boolean;
  manual: boolean;
  notes: string | null;
  voidReason: string | null;
}

const STANDING_CSV: Record<RunStanding, string> = { counted: 'yes', voided: 'no: voided', interrupted: 'no: interrupted', open: 'no: open', 'no-estimate': 'no: no estimate' };

export const RUN_COLUMNS: CsvColumn<RunExportRow>[] = [
  { header: 'run_id', value: (r) => r.id },
  { header: 'job_id', value: (r) => r.jobId },
  { header: 'job', value: (r) => r.jobTitle },
  { header: 'program', value: (r) => r.programName },
  { header: 'program_version', value: (r) => r.programVersion },
  { header: 'machine', value: (r) => r.machineName },
  { header: 'machine_version', value: (r) => r.machineVersion },
  { header: 'operator', value: (r) => r.operatorName },
  { header: 'status', value: (r) => r.status },
  { header: 'started_at_utc', value: (r) => iso(r.startedAt) },
  { header: 'finished_at_utc', value: (r) => iso(r.finishedAt) },
  { header: 'sheets_cut', value: (r) => r.sheetsCut },
  { header: 'estimate_s', value: (r) => fixed(r.estimatedSeconds, 1) },
  { header: 'actual_s', value: (r) => fixed(r.actualSeconds, 1) },
  { header: 'actual_over_estimate', value: (r) => fixed(runRatio(r), 4) },
  { header: 'interrupted', value: (r) => r.interrupted },
  { header: 'voided', value: (r) => r.voided },
  { header: 'entered_by_hand', value: (r) => r.manual },
  { header: 'in_statistics', value: (r) => STANDING_CSV[runStanding(r)] },
  { header: 'notes', value: (r) => r.notes },
  { header: 'void_reason', value: (r) => r.voidReason },
];

/** One estimate row as the export reads it. */
export interface EstimateExportRow {
  id: number;
  jobId: number;
  jobTitle: string;
  programName: string;
  programVersion: number;
  machineName: string;
  machineVersion: number;
  status: string;
  engineVersion: string;
  totalSeconds: number | null;
  calibratedSeconds: number | null;
  partCount: number | null;
  errorCount: number | null;
  warningCount: number | null;
  infoCount: number | null;
  createdAt: Date | string;
  finishedAt: Date | string | null;
}

export const ESTIMATE_COLUMNS: CsvColumn<EstimateExportRow>[] = [
  { header: 'estimate_id', value: (r) => r.id },
  { header: 'job_id', value: (r) => r.jobId },
  { header: 'job', value: (r) => r.jobTitle },
  { header: 'program', value: (r) => r.programName },
  { header: 'program_version', value: (r) => r.programVersion },
  { header: 'machine', value: (r) => r.machineName },
  { header: 'machine_version', value: (r) => r.machineVersion },
  { header: 'status', value: (r) => r.status },
  { header: 'engine_version', value: (r) => r.engineVersion },
  { header: 'estimate_per_sheet_s', value: (r) => fixed(r.totalSeconds, 1) },
  { header: 'calibrated_per_sheet_s', value: (r) => fixed(r.calibratedSeconds, 1) },
  { header: 'parts', value: (r) => r.partCount },
  { header: 'errors', value: (r) => r.errorCount },
  { header: 'warnings', value: (r) => r.warningCount },
  { header: 'notes_found', value: (r) => r.infoCount },
  { header: 'requested_at_utc', value: (r) => iso(r.createdAt) },
  { header: 'finished_at_utc', value: (r) => iso(r.finishedAt) },
];

/** CSV text of a batch of rows; the header record only with the first batch. */
export function csvText<T>(columns: readonly CsvColumn<T>[], rows: readonly T[], withHeader: boolean): string {
  const records = rows.map((row) => columns.map((c) => c.value(row)));
  if (withHeader) records.unshift(columns.map((c) => c.header));
  if (records.length === 0) return '';
  return stringify(records, {
    record_delimiter: 'windows',
    // csv-stringify quotes a field holding the record delimiter (CRLF) but not a bare LF or
    // CR; a note typed on one system and read on another holds either, so both are quoted
    quoted_match: /[\r\n]/,
    escape_formulas: true,
    cast: { boolean: (v) => (v ? 'true' : 'false') },
  });
}

/** RFC 4180 §3's media type, with its header parameter, and a file name that says what and when. */
export function csvHeaders(name: string, now: Date): Record<string, string> {
  return {
    'content-type': 'text/csv; charset=utf-8; header=present',
    'content-disposition': `attachment; filename="kerfcast-${name}-${now.toISOString().slice(0, 10)}.csv"`,
    'cache-control': 'no-store',
    'x-content-type-options': 'nosniff',
  };
}
