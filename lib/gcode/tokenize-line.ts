// Tokenizing one line. gcode-parser's parseLine is the tokenizer of record; a tight scanner
// of our own handles the common simple lines (letters, plain decimal numbers, spaces,
// comments) and hands every other line to parseLine. The scanner must give exactly
// parseLine's words — a property test compares the two — and it also classifies what
// parseLine would drop silently (#1, [1+2], stray text, letters without a value) so the
// interpreter can report it.
//
// parseLine's model: remove ( ) and ; comments, remove all whitespace, then match
// /[a-zA-Z][0-9+\-.]+/ words; the first N word is the line number, not a word; a value that
// Number() rejects stays a string. Whitespace and comments inside a word are therefore
// transparent ("X 1(c)2" is X12), which the scanner reproduces.
import { parseLine as parseLineImp } from 'gcode-parser';
import type { WordSink } from './line-words';

// imported bindings are read through getters once transpiled to CommonJS; local copies keep
// the per-line path free of them
const parseLine = parseLineImp;


export const ScanIssue = {
  /** nothing to report, but the line needs parseLine (very long numbers, non-ASCII) */
  fallback: 1,
  parameter: 2,
  expression: 4,
  /** a % program delimiter line */
  delimiter: 8,
  controller: 16,
  checksum: 32,
  noValue: 64,
  stray: 128,
  badNumber: 256,
  comment: 512,
  checksumMismatch: 1024,
  /** an O word: subroutine or loop control */
  oCode: 2048,
  /** parseLine found a *NN checksum (so a '*' was not stray) */
  checksumFound: 4096,
} as const;

// exact for 0…22, so mantissa / POW10[k] is the correctly rounded value, as Number() gives
const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

class Scanner {
  letter = -1;
  nChars = 0;
  neg = false;
  mant = 0;
  digits = 0;
  frac = 0;
  dot = false;
  anyDigit = false;
  invalid = false;
  sawN = false;

  begin(letter: number): void {
    this.letter = letter;
    this.nChars = 0;
    this.neg = false;
    this.mant = 0;
    this.digits = 0;
    this.frac = 0;
    this.dot = false;
    this.anyDigit = false;
    this.invalid = false;
  }

  /** ends the current word; returns issue bits */
  end(sink: WordSink): number {
    const letter = this.letter;
    if (letter < 0) return 0;
    this.letter = -1;
    if (this.nChars === 0) return ScanIssue.noValue;
    if (this.invalid || !this.anyDigit) return ScanIssue.badNumber;
    if (this.digits > 15 || this.frac > 22) return ScanIssue.fallback;
    if (letter === 13 && !this.sawN) {
      this.sawN = true;
      return 0;
    }
    const v = this.mant / POW10[this.frac];
    sink.add(letter, this.neg ? -v : v);
    return 0;
  }
}

const sc = new Scanner();

/**
 * Scans text[start, end) (one line, without its "\n"), writing words to sink. A non-zero
 * result means the line is unusual: the caller must reset the sink and use tokenizeWithParser.
 */
export function scanLine(text: string, start: number, end: number, sink: WordSink): number {
  let issues = 0;
  sc.letter = -1;
  sc.sawN = false;
  // a leading / is block delete (NISTIR 6556 §3.3.1); with the switch off the block runs
  let first = start;
  while (first < end && (text.charCodeAt(first) === 32 || text.charCodeAt(first) === 9)) first++;
  if (first < end && text.charCodeAt(first) === 47) start = first + 1;
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      if (sc.letter < 0) {
        issues |= ScanIssue.stray;
        continue;
      }
      sc.nChars++;
      sc.anyDigit = true;
      if (sc.dot) sc.frac++;
      if (sc.mant !== 0) {
        sc.mant = sc.mant * 10 + (c - 48);
        sc.digits++;
      } else if (c !== 48) {
        sc.mant = c - 48;
        sc.digits = 1;
      }
      continue;
    }
    const lc = c | 32;
    if (lc >= 97 && lc <= 122) {
      issues |= sc.end(sink);
      if (lc === 111) issues |= ScanIssue.oCode;
      sc.begin(lc - 97);
      continue;
    }
    switch (c) {
      case 32:
      case 9:
      case 13:
      case 11:
      case 12:
        continue;
      case 46: // .
        if (sc.letter < 0) issues |= ScanIssue.stray;
        else {
          if (sc.dot) sc.invalid = true;
          sc.dot = true;
          sc.nChars++;
        }
        continue;
      case 43: // +
      case 45: // -
        if (sc.letter < 0) issues |= ScanIssue.stray;
        else {
          if (sc.nChars > 0) sc.invalid = true;
          sc.neg = c === 45;
          sc.nChars++;
        }
        continue;
      case 40: {
        // ( … ): parseLine nests parentheses; the scanner takes only flat, closed comments
        let j = i + 1;
        while (j < end) {
          const d = text.charCodeAt(j);
          if (d === 41 || d === 40) break;
          j++;
        }
        if (j >= end || text.charCodeAt(j) === 40) {
          issues |= ScanIssue.comment;
          i = end;
        } else i = j;
        continue;
      }
      case 59: // ; comment to the end of the line
        i = end;
        continue;
      case 35:
        issues |= ScanIssue.parameter;
        continue;
      case 91:
      case 93:
        issues |= ScanIssue.expression;
        continue;
      case 37: {
        // % delimiter: parseLine ignores everything after it
        let rest = false;
        for (let j = i + 1; j < end; j++) {
          const d = text.charCodeAt(j);
          if (d !== 32 && d !== 9 && d !== 13) rest = true;
        }
        issues |= rest || sc.letter >= 0 || issues & ScanIssue.fallback ? ScanIssue.controller : ScanIssue.delimiter;
        i = end;
        continue;
      }
      case 36: {
        // $ commands: parseLine takes $ and the letters, digits and # after it as one command
        issues |= ScanIssue.controller;
        while (i + 1 < end) {
          const d = text.charCodeAt(i + 1) | 32;
          if ((d >= 97 && d <= 122) || (d >= 48 && d <= 57) || d === 35) i++;
          else break;
        }
        continue;
      }
      case 123: // { JSON commands run to the end of the line
        issues |= ScanIssue.controller;
        i = end;
        continue;
      case 42:
        issues |= ScanIssue.checksum;
        continue;
      case 41:
        issues |= ScanIssue.comment;
        continue;
      default:
        issues |= c > 127 ? ScanIssue.fallback : ScanIssue.stray;
    }
  }
  issues |= sc.end(sink);
  return issues;
}

/** the words of one line through gcode-parser's parseLine; returns checksum issue bits */
export function tokenizeWithParser(lineText: string, sink: WordSink): number {
  const r = parseLine(lineText);
  const words = r.words;
  for (let k = 0; k < words.length; k++) {
    const w = words[k];
    const letter = w[0].charCodeAt(0) - 65;
    if (letter < 0 || letter > 25) continue;
    if (typeof w[1] === 'number') sink.add(letter, w[1]);
    else sink.bad(letter, w[1]);
  }
  return (r.err ? ScanIssue.checksumMismatch : 0) | (r.cs !== undefined ? ScanIssue.checksumFound : 0);
}

/** one line through the same path interpret() takes: the scanner, or parseLine when unusual */
export function tokenizeLine(line: string, sink: WordSink): number {
  sink.reset();
  let issues = scanLine(line, 0, line.length, sink);
  if (issues !== 0) {
    sink.reset();
    issues |= tokenizeWithParser(line, sink);
  }
  return issues;
}
