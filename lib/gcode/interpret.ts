// The interpreter's main loop: walks the text line by line, tokenizes each line (fast scanner,
// gcode-parser's parseLine for anything unusual), interprets it, reports progress every
// `progressEvery` lines and stops early when the signal is aborted.
// Line ends follow NISTIR 6556 §3.3: LF, CRLF or a lone CR. A file demarcated by % lines
// (§3.1) ends at its second % line: what follows is not interpreted, and a file that opens
// with % but never closes it is reported as an error (it may have been cut short).
import { computeFacts } from './facts';
import { executeLine as executeLineImp } from './execute-line';
import { Interp } from './interpreter-state';
import { countLines, firstNonBlankLine, isBlank, isPercentLine as isPercentLineImp } from './line-ends';
import type { InterpretOptions, InterpretResult } from './move-list';
import { ScanIssue, scanLine as scanLineImp, tokenizeWithParser } from './tokenize-line';

// imported bindings are read through getters once transpiled to CommonJS; local copies keep
// the per-line path free of them
const executeLine = executeLineImp;
const scanLine = scanLineImp;
const isPercentLine = isPercentLineImp;
// a pure % line scans as a delimiter, or as a controller command after a non-ASCII mark (a BOM)
const PERCENT_BITS: number = ScanIssue.delimiter | ScanIssue.controller;

/** §3.1 demarcation: 0 before any % line, OPENED after a leading one, OTHER after a later one */
const OPENED = 1;
const OTHER = 2;

/** a % line at [pos, end): the new demarcation state, or CLOSED when it closes the file */
const CLOSED = 3;
function percentLine(state: number, text: string, pos: number): number {
  if (state === 0) return isBlank(text, 0, pos) ? OPENED : OTHER;
  return state === OPENED ? CLOSED : state;
}

/** the file's §3.1 demarcation as its % lines are met, and what it calls for at the end */
class Demarcation {
  state = 0;
  openLine = 0;
  openText = '';
  closeLine = 0;

  /** the % line [pos, end) is line lineNo; true when it closes the file */
  percent(text: string, pos: number, end: number, lineNo: number): boolean {
    this.state = percentLine(this.state, text, pos);
    if (this.state === OPENED && this.openLine === 0) {
      this.openLine = lineNo;
      this.openText = text.slice(pos, end);
    }
    if (this.state !== CLOSED) return false;
    this.closeLine = lineNo;
    return true;
  }

  /** once the loop is done, `after` where it stopped */
  report(ip: Interp, text: string, after: number): void {
    if (this.state === OPENED) {
      ip.diag.add('percent-unclosed', this.openLine, 'the program opens with a % line but no % line closes it, so the file may have been cut short (NISTIR 6556 §3.1)', this.openText);
    } else if (this.state === CLOSED) {
      const rest = firstNonBlankLine(text, after, this.closeLine + 1);
      if (rest) ip.diag.add('lines-after-closing-percent', rest.line, `everything after the closing % on line ${this.closeLine} is ignored (NISTIR 6556 §3.1)`, text.slice(rest.start, rest.end));
    }
  }
}

/**
 * The line loop: finds each line's end (LF, CRLF or CR), scans it, hands % lines to the
 * demarcation and every other line with words to executeLine, and checks progress and the
 * signal every `progressEvery` lines. The line-end search stays in the loop: its two cursors
 * are locals of the per-line path.
 */
export function interpret(text: string, options: InterpretOptions = {}): InterpretResult {
  const total = countLines(text);
  // most lines make about one move: small programs get one small chunk, large ones 65,536-move chunks
  const ip = new Interp(options, Math.min(Math.max(total + 16, 256), 1 << 16));
  ip.src = text;
  const every = Math.max(1, Math.floor(options.progressEvery ?? 50_000));
  const onProgress = options.onProgress;
  const signal = options.signal;
  const w = ip.w;
  const parserOnly = options.tokenizer === 'parser';
  const demarcation = new Demarcation();
  let cancelled = false;
  let pos = 0;
  let lineNo = 0;
  let nextCheck = every;
  const len = text.length;
  // the next LF and the next CR at or after pos (len when none), each searched again only once
  // passed: an LF-only file searches for CR once, a CR-only file for LF once
  let nextLf = -1;
  let nextCr = -1;
  let limit = len;
  while (pos < limit) {
    if (nextLf < pos) {
      nextLf = text.indexOf('\n', pos);
      if (nextLf === -1) nextLf = len;
    }
    if (nextCr < pos) {
      nextCr = text.indexOf('\r', pos);
      if (nextCr === -1) nextCr = len;
    }
    let end = nextLf;
    let next = nextLf + 1;
    if (nextCr < nextLf) {
      end = nextCr;
      next = nextCr + 1 === nextLf ? nextLf + 1 : nextCr + 1;
    }
    lineNo++;
    ip.lineNo = lineNo;
    w.reset();
    let issues = scanLine(text, pos, end, w);
    if (issues !== 0 || w.wordCount !== 0 || parserOnly) {
      if ((issues & PERCENT_BITS) !== 0 && isPercentLine(text, pos, end)) {
        // the file ends at a closing % line; the progress check below still runs for this line
        if (demarcation.percent(text, pos, end, lineNo)) limit = 0;
      } else {
        ip.lineStart = pos;
        ip.lineEnd = end;
        if (issues !== 0 || parserOnly) {
          w.reset();
          issues |= tokenizeWithParser(ip.lineText, w);
        }
        executeLine(ip, issues);
      }
    }
    pos = next;
    if (lineNo === nextCheck) {
      nextCheck += every;
      if (signal?.aborted) {
        cancelled = true;
        break;
      }
      onProgress?.(lineNo, total);
    }
  }
  if (!cancelled) {
    demarcation.report(ip, text, pos);
    if (!ip.ended && ip.moves.count > 0) ip.diag.add('program-end-missing', 0, 'the program has no M2/M30 end');
    onProgress?.(total, total);
  }
  return result(ip, options, total, cancelled);
}

/** the finished move list, the diagnostics and the program's facts */
function result(ip: Interp, options: InterpretOptions, total: number, cancelled: boolean): InterpretResult {
  const moves = ip.moves.finish();
  const f = computeFacts(moves);
  return {
    moves,
    diagnostics: ip.diag.finish(),
    cancelled,
    facts: {
      units: ip.declaredUnits ?? (options.defaultUnits === 'inch' ? 'inch' : 'mm'),
      lineCount: total,
      ...f,
    },
  };
}
