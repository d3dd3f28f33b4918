// Public entry of the G-code engine: interpret RS274/NGC text (NISTIR 6556 as the reference)
// into the move list, with diagnostics and program facts; the move-list types; a builder to
// write move lists by hand; arc helpers (flattening within a tolerance, points, lengths); and
// the check that turns a file's bytes into program text or refuses it.
export * from './move-list';
export { interpret } from './interpret';
export { createMoveListBuilder, moveListBytes, type MoveListBuilder } from './move-list-builder';
export { arcChordCount, arcIndexOfMove, arcLength, arcPoint, flattenArc, helixLength, moveLength } from './arc-geometry';
export { DIAGNOSTIC_CODES, type DiagnosticCode } from './diagnostic-codes';
export { scanLine, tokenizeLine, tokenizeWithParser, ScanIssue } from './tokenize-line';
export { WordList } from './line-words';
export { checkProgramBytes, ProgramTextCheck, type ProgramText, type ProgramTextRefusal, type ProgramTextRefusalCode, type ProgramTextResult } from './program-text';
