// Collects findings, keeping the first few of each kind so that a program with the same fault
// on ten thousand lines gives a readable list; the rest are counted for the summary.
// A finding's message is a full sentence (or several) that leaves its own line number to the
// finding's `line`, which every listing shows beside it; it names other lines where they matter.
import type { Finding, FindingKind, FindingSeverity } from '../types';

export class FindingSink {
  readonly findings: Finding[] = [];
  readonly suppressed: Partial<Record<FindingKind, number>> = {};
  private readonly kept = new Map<FindingKind, number>();

  constructor(private readonly maxPerKind: number) {}

  /** how many more findings of this kind would be listed (past that, add() only counts them) */
  room(kind: FindingKind): number {
    return this.maxPerKind - (this.kept.get(kind) ?? 0);
  }

  /** whether a finding of this kind added now would be listed */
  listing(kind: FindingKind): boolean {
    return this.room(kind) > 0;
  }

  /** n findings of this kind past its limit: counted for the summary, not listed */
  count(kind: FindingKind, n = 1): void {
    if (n > 0) this.suppressed[kind] = (this.suppressed[kind] ?? 0) + n;
  }

  /**
   * `message` may be a function, called only for a finding that is listed (the rest are
   * counted). On a per-move path, test listing() and build the text only then: a closure made
   * for every call costs its context even when the finding is only counted.
   */
  add(kind: FindingKind, severity: FindingSeverity, line: number, message: string | (() => string), part?: number): void {
    const n = this.kept.get(kind) ?? 0;
    if (n >= this.maxPerKind) {
      this.count(kind);
      return;
    }
    this.kept.set(kind, n + 1);
    const f: Finding = { kind, severity, line, message: typeof message === 'function' ? message() : message };
    if (part !== undefined) f.part = part;
    this.findings.push(f);
  }

  /** findings sorted by line, then errors before warnings before infos */
  sorted(): Finding[] {
    const rank = { error: 0, warning: 1, info: 2 } as const;
    return this.findings.slice().sort((a, b) => a.line - b.line || rank[a.severity] - rank[b.severity]);
  }
}

/** said wherever a finding is about a piece that can come loose: a freed part, a slug, a rapid through stock */
export const THROWN_PIECE = "A thrown piece can hurt someone nearby: stand clear and keep the guards closed, as the shop's rules require.";

export function fmt(n: number, digits = 1): string {
  return (Math.round(n * 10 ** digits) / 10 ** digits).toFixed(digits);
}
