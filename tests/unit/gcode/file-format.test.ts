// The file and line format of NISTIR 6556 against the interpreter:
// §3.1: "the first non-blank line of a file may contain nothing but a percent sign, possibly
// surrounded by white space, and later in the file there may be a similar line"; "an error will
// be signalled if a file has a percent line at the beginning but not at the end"; "the useful
// contents of a file demarcated by percents stop after the second percent line. Anything after
// that is ignored." §3.3: a line ends with "an end of line marker (carriage return or line feed
// or both)". The independent reference for line numbers is JavaScript's split on /\r\n|\r|\n/.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MoveKind } from '@/lib/gcode';
import { estimate } from '@/lib/kinematics';
import { testProfile } from '../kinematics/support/moves';
import { codes, errors, points, run, totals } from './helpers';

const diag = (r: ReturnType<typeof run>, code: string) => r.diagnostics.filter((d) => d.code === code);

describe('NISTIR 6556 §3.1: a file demarcated by % lines', () => {
  it('everything after the closing % is ignored, and a warning names its first line', () => {
    const r = run('%\nG21 G90 F600\nG1 X10\n%\nG1 X100\nM2\n');
    expect(totals(r).feed).toBeCloseTo(10, 9);
    expect(points(r, [MoveKind.feed])).toEqual([['feed', 10, 0, 0]]);
    const after = diag(r, 'lines-after-closing-percent');
    expect(after).toHaveLength(1);
    expect(after[0]).toMatchObject({ line: 5, severity: 'warning', text: 'G1 X100' });
    expect(after[0].message).toMatch(/line 4/);
    expect(errors(r)).toEqual([]);
  });

  it('blank lines after the closing % are no content; the first non-blank one is reported by its number', () => {
    expect(codes(run('%\nG21 F600\nG1 X1\nM2\n%\n\n  \n'))).toEqual([]);
    const r = run('%\nG21 F600\nG1 X1\nM2\n%\n\n\t\nG1 X5\n');
    expect(diag(r, 'lines-after-closing-percent').map((d) => d.line)).toEqual([8]);
    expect(totals(r).feed).toBeCloseTo(1, 9);
  });

  it('blank lines and white space around the opening % still make it the first non-blank line', () => {
    const r = run('\n  \n  %  \nG21 F600\nG1 X10\nM2\n\t% \nG1 X99\n');
    expect(totals(r).feed).toBeCloseTo(10, 9);
    expect(diag(r, 'lines-after-closing-percent').map((d) => d.line)).toEqual([8]);
    expect(errors(r)).toEqual([]);
  });

  it('a file that opens with % and never closes is an error on the opening line; the code still runs', () => {
    const r = run('%\nG21 F600\nG1 X10\nM2\n');
    const open = diag(r, 'percent-unclosed');
    expect(open).toHaveLength(1);
    expect(open[0]).toMatchObject({ line: 1, severity: 'error', text: '%' });
    expect(totals(r).feed).toBeCloseTo(10, 9);
    // a file cut short in the middle of its program
    const cut = run('  %\nG21 F600\nG1 X10\nG1 X2');
    expect(diag(cut, 'percent-unclosed')).toMatchObject([{ line: 1, text: '  %' }]);
  });

  it('a % that is not the first non-blank line does not demarcate the file: later % lines end nothing', () => {
    const r = run('(shelf bracket)\n%\nG21 F600\nG1 X10\n%\nG1 X30\nM2\n');
    expect(totals(r).feed).toBeCloseTo(30, 9);
    expect(diag(r, 'percent-unclosed')).toEqual([]);
    expect(diag(r, 'lines-after-closing-percent')).toEqual([]);
  });

  it('only a line holding nothing but % counts: "% (note)" is not a closing line', () => {
    const r = run('%\nG21 F600\nG1 X10\n% (note)\nG1 X20\nM2\n%\n');
    expect(totals(r).feed).toBeCloseTo(20, 9);
    expect(diag(r, 'percent-unclosed')).toEqual([]);
  });

  it('the closing % works the same with CRLF and CR line ends', () => {
    for (const eol of ['\r\n', '\r']) {
      const r = run(['%', 'G21 F600', 'G1 X10', '%', 'G1 X100', ''].join(eol));
      expect(totals(r).feed).toBeCloseTo(10, 9);
      expect(diag(r, 'lines-after-closing-percent').map((d) => d.line)).toEqual([5]);
    }
  });
});

// a program with diagnostics on known lines, so the numbering can be compared
const PROGRAM = [
  '(plate, 18 mm birch ply)',
  'G21 G90 G17',
  'T1 M6',
  'S18000 M3',
  'G0 X10 Y10 Z5',
  'G1 Z-3 F900',
  'G1 X1..2', // bad number: error on line 7
  'G1 X60',
  '',
  'G2 X70 Y20 I5 J0', // radius mismatch: error on line 10
  'G3 X60 Y30 R10',
  'G1 Y10',
  'G5', // unknown G code: error on line 13
  'G0 Z5',
  'M5',
  'M30',
];

describe('NISTIR 6556 §3.3: a line ends at CR, LF or CRLF', () => {
  const lf = run(PROGRAM.join('\n') + '\n');

  it.each([
    ['CR only', '\r'],
    ['CRLF', '\r\n'],
  ])('%s line ends read the same lines as LF: the same moves and the same diagnostics on the same lines', (_name, eol) => {
    const r = run(PROGRAM.join(eol) + eol);
    expect(r.facts.lineCount).toBe(PROGRAM.length);
    expect(r.moves).toEqual(lf.moves);
    expect(r.diagnostics).toEqual(lf.diagnostics);
    expect(errors(r).length).toBeGreaterThanOrEqual(3);
    expect(r.diagnostics.find((d) => d.code === 'bad-number')).toMatchObject({ line: 7, text: 'G1 X1..2' });
  });

  it('a CR-only file is estimated like the LF file, not as one line taking 0 s', () => {
    const profile = testProfile();
    const want = estimate(lf.moves, profile).totalSeconds;
    expect(want).toBeGreaterThan(0);
    expect(estimate(run(PROGRAM.join('\r')).moves, profile).totalSeconds).toBe(want);
  });

  it('line counts: CRLF is one end, CR CR and LF CR are two', () => {
    expect(run('G0 X1\r').facts.lineCount).toBe(1);
    expect(run('G0 X1\r\n').facts.lineCount).toBe(1);
    expect(run('G0 X1\rG0 X2').facts.lineCount).toBe(2);
    expect(run('\r\n\r\n').facts.lineCount).toBe(2);
    expect(run('G0 X1\r\rG5').diagnostics.find((d) => d.code === 'unsupported-g-code')?.line).toBe(3);
    expect(run('G0 X1\n\rG5').diagnostics.find((d) => d.code === 'unsupported-g-code')?.line).toBe(3);
  });

  it('any mix of LF, CR and CRLF reads as the split does: the same result as the LF text of those lines', () => {
    const eol = fc.constantFrom('\n', '\r', '\r\n');
    let textsChecked = 0;
    fc.assert(
      fc.property(fc.array(eol, { minLength: PROGRAM.length, maxLength: PROGRAM.length }), fc.boolean(), (ends, lastEnd) => {
        const text = PROGRAM.map((l, k) => l + (k < PROGRAM.length - 1 || lastEnd ? ends[k] : '')).join('');
        // a CR that meets the LF after an empty line is one CRLF end, so the split decides the lines
        const asRead = text.split(/\r\n|\r|\n/);
        const r = run(text);
        const viaLf = run(asRead.join('\n'));
        expect(r.facts.lineCount).toBe(lastEnd ? asRead.length - 1 : asRead.length);
        expect(r.moves).toEqual(viaLf.moves);
        expect(r.diagnostics).toEqual(viaLf.diagnostics);
        for (const d of r.diagnostics) {
          if (d.line > 0 && d.text !== undefined) {
            expect(d.text).toBe(asRead[d.line - 1]);
            textsChecked++;
          }
        }
      }),
      { numRuns: 200 },
    );
    // PROGRAM has two errors with their line's text (lines 7 and 10): both checked in every run
    expect(textsChecked).toBeGreaterThanOrEqual(2 * 200);
  });
});
