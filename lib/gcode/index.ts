// Public entry of the G-code engine: interpret RS274/NGC text (NISTIR 6556 as the reference)
// into the move list, with diagnostics and program facts; the move-list types; a builder to
// write move lists by hand; arc helpers (flattening within a tolerance, points, lengths); and
// the check that turns a file's bytes into program text or refuses it.
//
// The stages of interpret(), per line and then once at the end:
//
// | stage                | module                                   | input                          | output                                  |
// |----------------------|------------------------------------------|--------------------------------|-----------------------------------------|
// | 0 bytes → text       | program-text.ts (before interpret)       | file bytes                     | ProgramText or a refusal                |
// | 1 lines              | interpret.ts, line-ends.ts               | program text                   | one line at a time, % and line ends     |
// | 2 words              | tokenize-line.ts, line-words.ts          | one line                       | WordList (G/M codes, letter values)     |
// | 3 modal check        | modal-groups.ts                          | WordList                       | diagnostics for two codes of one group  |
// | 4 execute            | execute-line.ts, interpreter-state.ts    | WordList, modal state          | state changes, motion and records       |
// | 5 motion             | motion.ts, arc-geometry.ts, canned-cycles.ts | target, modal state        | moves written to the builder            |
// | 6 move list          | move-list-builder.ts → move-list.ts      | moves                          | MoveList (typed arrays, arc table)      |
// | 7 facts              | facts.ts                                 | MoveList                       | ProgramFacts (bounds, tools, speeds)    |
// | diagnostics          | diagnostic-sink.ts, diagnostic-codes.ts  | every stage's messages         | Diagnostic[] capped per code            |
export * from './move-list';
export { interpret } from './interpret';
export { createMoveListBuilder, moveListBytes, type MoveListBuilder } from './move-list-builder';
export { arcChordCount, arcIndexOfMove, arcLength, arcPoint, flattenArc, helixLength, moveLength } from './arc-geometry';
export { DIAGNOSTIC_CODES, type DiagnosticCode } from './diagnostic-codes';
export { scanLine, tokenizeLine, tokenizeWithParser, ScanIssue } from './tokenize-line';
export { WordList } from './line-words';
export { checkProgramBytes, ProgramTextCheck, type ProgramText, type ProgramTextRefusal, type ProgramTextRefusalCode, type ProgramTextResult } from './program-text';
