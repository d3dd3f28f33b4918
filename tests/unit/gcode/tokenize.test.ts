// The fast scanner must give exactly the words of gcode-parser's parseLine, the tokenizer of
// record (property test over random lines), and flag what parseLine drops silently.
import fc from 'fast-check';
import { parseLine } from 'gcode-parser';
import { describe, expect, it } from 'vitest';
import { ScanIssue, scanLine, tokenizeLine, WordList } from '@/lib/gcode';

function scanned(line: string): { issues: number; words: Array<[string, number | string]> } {
  const w = new WordList();
  const issues = scanLine(line, 0, line.length, w);
  return { issues, words: w.words };
}

const letter = fc.constantFrom(...'GMXYZIJKFSTRPQNLgmxyzijkfsn'.split(''));
const numberText = fc.oneof(
  fc.integer({ min: -99999, max: 99999 }).map(String),
  fc.double({ min: -5000, max: 5000, noNaN: true }).map((v) => v.toFixed(4)),
  fc.double({ min: -5000, max: 5000, noNaN: true }).map((v) => String(v)),
  fc.constantFrom('0', '-0', '+5', '.5', '5.', '-.25', '007', '1.50000', '123456789012345678', '0.000000000000000000001', '1..2', '-', '.', '1-2', '+-1'),
);
const fragment = fc.oneof(
  { weight: 6, arbitrary: fc.tuple(letter, fc.constantFrom('', ' ', '\t'), numberText).map(([l, s, n]) => l + s + n) },
  { weight: 2, arbitrary: fc.constantFrom(' ', '  ', '\t', '\r') },
  { weight: 2, arbitrary: fc.string({ maxLength: 8 }).map((s) => `(${s.replace(/[()]/g, '')})`) },
  { weight: 1, arbitrary: fc.constantFrom('(', ')', ';', '; tail', '#1', '[1+2]', '%', '$H', '*12', '{"a":1}', '=', '/', ',', '\u00a0', 'é', 'X', 'G', '12', '-', '.') },
);
const randomLine = fc.array(fragment, { maxLength: 12 }).map((parts) => parts.join(''));

describe('scanner vs gcode-parser parseLine', () => {
  it('property: whenever the scanner takes a line, its words equal parseLine words (Object.is on values)', () => {
    let taken = 0;
    fc.assert(
      fc.property(randomLine, (line) => {
        const s = scanned(line);
        if (s.issues === 0) {
          taken++;
          expect(s.words).toEqual(parseLine(line).words);
        }
      }),
      { numRuns: 5000 },
    );
    // the scanner declines lines with stray text, comments it cannot nest and the like (about
    // 60% of these); the comparison must still have run on a good share of the 5000
    expect(taken).toBeGreaterThanOrEqual(1000);
  });

  it('property: tokenizeLine (the interpreter path) always equals parseLine words', () => {
    fc.assert(
      fc.property(randomLine, (line) => {
        const w = new WordList();
        tokenizeLine(line, w);
        // a second *NN checksum comes back from parseLine as a '*' word; only letters are words
        expect(w.words).toEqual(parseLine(line).words.filter((x) => /^[A-Z]$/.test(x[0])));
      }),
      { numRuns: 5000 },
    );
  });

  it('property: the same holds for arbitrary strings (any code unit, no line break)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 40 }).map((t) => t.replace(/\n/g, ' ')), (line) => {
        const w = new WordList();
        tokenizeLine(line, w);
        expect(w.words).toEqual(parseLine(line).words.filter((x) => /^[A-Z]$/.test(x[0])));
      }),
      { numRuns: 5000 },
    );
  });

  it('the common CAM lines take the fast path', () => {
    for (const line of ['G1 X12.5 Y-3.25 F1500', 'N120 G2 X10 Y16 I3 J4', 'g0x1y2z3', 'G1 X 10 (comment) Y 5', 'M3 S18000 ; spindle', '(only a comment)', '', 'G1 X1\r']) {
      const s = scanned(line);
      expect(s.issues, line).toBe(0);
      expect(s.words, line).toEqual(parseLine(line).words);
    }
  });

  it('whitespace and comments inside a word are transparent, as in parseLine: X 1(c)2 is X12', () => {
    expect(scanned('X 1(c)2').words).toEqual([['X', 12]]);
    expect(parseLine('X 1(c)2').words).toEqual([['X', 12]]);
  });

  it('the first N is the line number, a second N is a word (parseLine semantics)', () => {
    expect(scanned('N10 G1 N20').words).toEqual([['G', 1], ['N', 20]]);
  });

  it('flags what parseLine would drop silently', () => {
    expect(scanned('G1 X#1').issues & ScanIssue.parameter).toBeTruthy();
    expect(parseLine('G1 X#1').words).toEqual([['G', 1]]); // X is gone without a trace
    expect(scanned('G1 X[1+2]').issues & ScanIssue.expression).toBeTruthy();
    expect(scanned('G1 X Y2').issues & ScanIssue.noValue).toBeTruthy();
    expect(scanned('G1 X1..2').issues & ScanIssue.badNumber).toBeTruthy();
    expect(scanned('12 G1').issues & ScanIssue.stray).toBeTruthy();
    expect(scanned('O100 sub').issues & ScanIssue.oCode).toBeTruthy();
    expect(scanned('%').issues).toBe(ScanIssue.delimiter);
  });
});
