// The export's CSV text (lib/reports/csv.ts) against RFC 4180 §2: records end in CRLF (rule
// 1 and 2), a header record first (rule 3), a field holding a comma, a double quote or a line
// break is enclosed in double quotes (rule 6) and a double quote inside is doubled (rule 7),
// e.g. the field  Say "hi", then go  is written  "Say ""hi"", then go". Read back with csv-parse
// (an independent parser from the same family of packages, tested against the RFC by its authors).
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { csvHeaders, csvText, RUN_COLUMNS, type RunExportRow } from '@/lib/reports/csv';

const row = (o: Partial<RunExportRow> = {}): RunExportRow => ({
  id: 7,
  jobId: 3,
  jobTitle: 'Shelf brackets',
  programName: 'brackets.nc',
  programVersion: 2,
  machineName: 'Router 1',
  machineVersion: 4,
  operatorName: 'Lena',
  status: 'finished',
  startedAt: new Date('2026-11-20T08:00:00Z'),
  finishedAt: new Date('2026-11-20T09:00:30Z'),
  sheetsCut: 2,
  estimatedSeconds: 3200,
  actualSeconds: 3630,
  interrupted: false,
  voided: false,
  manual: false,
  notes: null,
  voidReason: null,
  ...o,
});

describe('RFC 4180 text', () => {
  it('quotes a comma, a quote and a line break, doubles inner quotes, ends records in CRLF', () => {
    const text = csvText([{ header: 'a', value: (r: { v: string }) => r.v }], [{ v: 'Say "hi", then go' }, { v: 'two\nlines' }, { v: 'plain' }], true);
    expect(text).toBe('a\r\n"Say ""hi"", then go"\r\n"two\nlines"\r\nplain\r\n');
  });

  it('a note typed as a formula is written with a leading apostrophe (OWASP CSV injection)', () => {
    const text = csvText([{ header: 'n', value: (r: { v: string }) => r.v }], [{ v: '=HYPERLINK("x")' }, { v: '@sum' }, { v: '+1' }], false);
    expect(parse(text, { relax_quotes: false }).map((r: string[]) => r[0])).toEqual(["'=HYPERLINK(\"x\")", "'@sum", "'+1"]);
  });

  it('a run row round-trips through csv-parse: the header, the figures and a hard note', () => {
    const note = 'Sheet 2, corner lifted; "held" it with\r\na clamp';
    const text = csvText(RUN_COLUMNS, [row({ notes: note }), row({ id: 8, interrupted: true, actualSeconds: 1000, notes: null })], true);
    const records: Record<string, string>[] = parse(text, { columns: true });
    expect(Object.keys(records[0])).toEqual(RUN_COLUMNS.map((c) => c.header));
    expect(records[0]).toMatchObject({
      run_id: '7',
      started_at_utc: '2026-11-20T08:00:00.000Z',
      estimate_s: '3200',
      actual_s: '3630',
      // 3630 / 3200 = 1.134375 → 4 decimals
      actual_over_estimate: '1.1344',
      interrupted: 'false',
      in_statistics: 'yes',
      notes: note,
    });
    expect(records[1]).toMatchObject({ run_id: '8', interrupted: 'true', in_statistics: 'no: interrupted', notes: '' });
  });

  it('no rows and no header: nothing; the media type names the header (RFC 4180 §3)', () => {
    expect(csvText(RUN_COLUMNS, [], false)).toBe('');
    expect(csvHeaders('runs', new Date('2026-12-04T10:00:00Z'))).toMatchObject({ 'content-type': 'text/csv; charset=utf-8; header=present', 'content-disposition': 'attachment; filename="kerfcast-runs-2026-12-04.csv"' });
  });
});
