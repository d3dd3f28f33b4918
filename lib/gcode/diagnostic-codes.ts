// The stable diagnostic codes of the G-code engine. Codes are ours, kebab-case, and never
// change meaning once published: the viewer, the findings list and stored estimates refer to
// them. Severity: "error" where NISTIR 6556 makes the interpreter stop (we report and go on),
// "warning" where something is ignored or guessed, "info" where a fact is worth knowing.
import type { Severity } from './move-list';

export const DIAGNOSTIC_CODES = {
  // tokens and words
  'bad-number': { severity: 'error', summary: 'a word whose value is not a number (e.g. X1..2); the line is skipped' },
  'word-without-value': { severity: 'error', summary: 'a letter with no number after it; the line is skipped' },
  'duplicate-word': { severity: 'error', summary: 'the same letter twice on one line (NISTIR 6556 §3.3.5); the line is skipped' },
  'stray-text': { severity: 'warning', summary: 'characters that are not words or comments; they are ignored' },
  'comment-unclosed': { severity: 'warning', summary: 'a "(" comment with no ")" or a nested comment' },
  'unsupported-word': { severity: 'warning', summary: 'a letter RS274/NGC does not use here (E, U, V, W…); ignored' },
  'rotary-axis-ignored': { severity: 'warning', summary: 'A/B/C words: rotary axes are not interpreted' },
  'parameter-unsupported': { severity: 'error', summary: 'parameters (#1) are not interpreted; the line is skipped' },
  'expression-unsupported': { severity: 'error', summary: 'expressions ([1+2]) are not interpreted; the line is skipped' },
  'o-code-unsupported': { severity: 'error', summary: 'O-code subroutines and loops are not interpreted; the line is skipped' },
  'controller-command-ignored': { severity: 'warning', summary: 'controller commands ($…, {…}, %… after code) are ignored' },
  'checksum-mismatch': { severity: 'warning', summary: 'a *NN checksum that does not match the line' },
  // modal groups and codes
  'modal-group-conflict': { severity: 'error', summary: 'two words of one modal group on a line (NISTIR 6556 Table 4); the line is skipped' },
  'unsupported-g-code': { severity: 'error', summary: 'a G code the engine does not interpret; the line is skipped' },
  'unsupported-m-code': { severity: 'warning', summary: 'an M code the engine does not interpret; ignored' },
  'axis-word-conflict': { severity: 'error', summary: 'a group 0 code and a motion code both want the axis words' },
  'axis-words-with-g80': { severity: 'error', summary: 'axis words while G80 is in force (NISTIR 6556 §3.5.16); the line is skipped' },
  'g10-unsupported': { severity: 'warning', summary: 'G10 (setting offsets) is not interpreted; ignored' },
  'work-offset-assumed-zero': { severity: 'info', summary: 'G55–G59 are taken as G54, since offsets set at the machine are unknown' },
  'cutter-compensation-ignored': { severity: 'warning', summary: 'G41/G42: the path is shown as programmed, without radius compensation' },
  'length-compensation-ignored': { severity: 'info', summary: 'G43: tool length offsets are not applied' },
  'home-position-assumed': { severity: 'info', summary: 'G28/G30 go to the machine home from the machine profile' },
  // feed, spindle, tools
  'feed-missing': { severity: 'error', summary: 'a feed move before any F (NISTIR 6556 §3.5.19); the move has feed 0' },
  'inverse-time-feed-missing': { severity: 'error', summary: 'G93 feed move without F on its line (NISTIR 6556 §3.5.19); the move has feed 0' },
  'spindle-speed-missing': { severity: 'warning', summary: 'M3/M4 with no S in force' },
  'tool-change-without-tool': { severity: 'warning', summary: 'M6 with no T selected' },
  // arcs
  'arc-mixed-formats': { severity: 'error', summary: 'R and I/J/K on one arc (NISTIR 6556 §3.5.3); the arc is skipped' },
  'arc-no-axis-word': { severity: 'error', summary: 'G2/G3 with no axis word (NISTIR 6556 §3.5.3); the arc is skipped' },
  'arc-no-offsets': { severity: 'error', summary: 'centre-format arc without an offset in the plane; the arc is skipped' },
  'arc-radius-mismatch': { severity: 'error', summary: 'start and end radius differ beyond tolerance (NISTIR 6556 §3.5.3.2); the arc is skipped' },
  'arc-radius-end-equals-start': { severity: 'error', summary: 'radius-format arc whose end is its start (NISTIR 6556 §3.5.3.1); the arc is skipped' },
  'arc-radius-too-small': { severity: 'error', summary: 'R smaller than half the chord (NISTIR 6556 §3.5.3.1); the arc is skipped' },
  'arc-radius-no-end': { severity: 'error', summary: 'radius-format arc with neither in-plane end word; the arc is skipped' },
  // dwell and cycles
  'dwell-missing-p': { severity: 'error', summary: 'G4 without P' },
  'dwell-negative': { severity: 'error', summary: 'G4 or cycle dwell with negative P (NISTIR 6556 §3.5.4)' },
  'cycle-missing-z': { severity: 'error', summary: 'canned cycle with no Z in force; the cycle is skipped' },
  'cycle-missing-r': { severity: 'error', summary: 'canned cycle with no R in force; the cycle is skipped' },
  'cycle-r-below-z': { severity: 'error', summary: 'canned cycle R below its Z (NISTIR 6556 §3.5.16); the cycle is skipped' },
  'cycle-bad-q': { severity: 'error', summary: 'peck cycle with Q missing or ≤ 0 (NISTIR 6556 §3.5.16.4); the cycle is skipped' },
  'cycle-bad-l': { severity: 'error', summary: 'canned cycle L not a positive integer; the cycle is skipped' },
  'cycle-plane-unsupported': { severity: 'error', summary: 'canned cycles are interpreted in G17 only; the cycle is skipped' },
  'cycle-inverse-time': { severity: 'error', summary: 'canned cycle in G93 inverse time mode; the cycle is skipped' },
  'unsupported-canned-cycle': { severity: 'error', summary: 'G84/G86/G87/G88 are not interpreted; the cycle is skipped' },
  // program flow
  'lines-after-program-end': { severity: 'warning', summary: 'code after M2/M30; not interpreted' },
  'percent-unclosed': { severity: 'error', summary: 'the file opens with a % line but none closes it (NISTIR 6556 §3.1); it may be cut short' },
  'lines-after-closing-percent': { severity: 'warning', summary: 'text after the closing % line (NISTIR 6556 §3.1); not interpreted' },
  'program-end-missing': { severity: 'info', summary: 'no M2/M30 at the end of the program' },
  'diagnostics-truncated': { severity: 'info', summary: 'further findings of one code were counted, not listed' },
} as const satisfies Record<string, { severity: Severity; summary: string }>;

export type DiagnosticCode = keyof typeof DIAGNOSTIC_CODES;
