// Interprets one tokenized line in the order of execution of NISTIR 6556 §3.8: feed mode,
// F, S, T, M6 (which leaves the spindle stopped, §3.6.3), spindle, coolant, dwell, plane,
// units, compensation, coordinate system, path mode, distance mode, retract mode,
// G28/G30/G10/G92, motion, stops. Lines with errors the standard treats as fatal are reported
// with their text and skipped; the program goes on.
// One deviation: G20/G21 take effect before F on the same line, as CAM output intends.
import { cannedCycle as cannedCycleImp } from './canned-cycles';
import { INCH_MM, type Interp } from './interpreter-state';
import { L as LETTERS } from './line-words';
import { GGroup as GGROUP, G_GROUP_SLOTS, MGroup as MGROUP, M_GROUP_SLOTS, gGroup as gGroupImp, mGroup as mGroupImp } from './modal-groups';
import { MoveKind as MOVE_KIND } from './move-list';
import { arcMove as arcMoveImp, homeMove, machineMove, straightMove as straightMoveImp } from './motion';
import { ScanIssue as SCAN_ISSUE } from './tokenize-line';

// imported bindings are read through getters once transpiled to CommonJS; local copies keep
// the per-line path free of them
const L = { ...LETTERS };
const GGroup = { ...GGROUP };
const MGroup = { ...MGROUP };
const MoveKind = { ...MOVE_KIND };
const ScanIssue = { ...SCAN_ISSUE };
const gGroup = gGroupImp;
const mGroup = mGroupImp;
const arcMove = arcMoveImp;
const straightMove = straightMoveImp;
const cannedCycle = cannedCycleImp;
const inchMm = INCH_MM;


const gSlot = new Int32Array(G_GROUP_SLOTS);
const mSlot = new Int32Array(M_GROUP_SLOTS);
const IGNORED_LETTERS = (1 << L.E) | (1 << L.U) | (1 << L.V) | (1 << L.W);

function reportScanIssues(ip: Interp, issues: number): boolean {
  const d = ip.diag;
  const n = ip.lineNo;
  const t = ip.lineText;
  if (issues & ScanIssue.oCode) {
    d.add('o-code-unsupported', n, 'O-code subroutines and loops are not interpreted; the line is skipped', t);
    return false;
  }
  if (issues & ScanIssue.parameter) {
    d.add('parameter-unsupported', n, 'parameters (#) are not interpreted; the line is skipped', t);
    return false;
  }
  if (issues & ScanIssue.expression) {
    d.add('expression-unsupported', n, 'expressions in [ ] are not interpreted; the line is skipped', t);
    return false;
  }
  if (issues & ScanIssue.noValue) {
    d.add('word-without-value', n, 'a letter has no number after it; the line is skipped', t);
    return false;
  }
  if (issues & ScanIssue.stray || (issues & ScanIssue.checksum && !(issues & ScanIssue.checksumFound))) d.add('stray-text', n, 'characters that are neither words nor comments are ignored', t);
  if (issues & ScanIssue.comment) d.add('comment-unclosed', n, 'a comment is not closed, or is nested; parentheses are read as the tokenizer nests them', t);
  if (issues & ScanIssue.controller) d.add('controller-command-ignored', n, 'controller commands ($, {, %) are ignored', t);
  if (issues & ScanIssue.checksumMismatch) d.add('checksum-mismatch', n, 'the * checksum does not match the line', t);
  return true;
}

/**
 * One line, in named steps: the checks that skip a line, the G and M codes sorted into their
 * modal groups, then the line's effects in the order of §3.8 (units first, see the header).
 */
export function executeLine(ip: Interp, issues: number): void {
  if (issues !== 0 && !reportScanIssues(ip, issues)) return;
  if (ip.w.wordCount === 0) return;
  if (!lineRuns(ip) || !readGCodes(ip) || !readMCodes(ip)) return;
  reportIgnoredWords(ip);
  setUnitsFeedSpeedTool(ip);
  changeToolAndSpindle(ip);
  dwell(ip);
  setModes(ip);
  motionAndOffsets(ip);
  const stop = mSlot[MGroup.stop];
  if (stop === 0 || stop === 1 || stop === 60) ip.atRest(MoveKind.programStop, stop === 1 ? 1 : 0);
  else if (stop === 2 || stop === 30) endProgram(ip);
}

/** false, with its diagnostic, for a line that is not interpreted: after the end, a bad number, a word twice, an O word */
function lineRuns(ip: Interp): boolean {
  const w = ip.w;
  const d = ip.diag;
  const n = ip.lineNo;
  const t = ip.lineText;
  if (ip.ended && !ip.continueAfterEnd) {
    d.once('lines-after-program-end', n, 'code after M2/M30 is not interpreted', t);
    return false;
  }
  if (w.badWords.length) {
    const b = w.badWords[0];
    const word = `${String.fromCharCode(65 + b.letter)}${b.raw}`;
    const at = t.toUpperCase().indexOf(word.toUpperCase());
    d.add('bad-number', n, `${word} is not a number; the line is skipped`, t, at >= 0 ? at + 1 : undefined);
    return false;
  }
  if (w.duplicates || w.tooManyCodes) {
    const letter = 31 - Math.clz32(w.duplicates);
    d.add('duplicate-word', n, w.duplicates ? `${String.fromCharCode(65 + letter)} appears twice on the line; the line is skipped` : 'too many G or M words on one line; the line is skipped', t);
    return false;
  }
  if (w.has(L.O)) {
    d.add('o-code-unsupported', n, 'O-code subroutines and loops are not interpreted; the line is skipped', t);
    return false;
  }
  return true;
}

/** the line's G codes into gSlot by modal group (code × 10); false, reported, for an unknown code or two of one group */
function readGCodes(ip: Interp): boolean {
  const w = ip.w;
  gSlot.fill(-1);
  for (let k = 0; k < w.gCount; k++) {
    const v = w.g[k] * 10;
    const code = Math.round(v);
    const group = Math.abs(v - code) < 1e-6 ? gGroup(code) : -1;
    if (group < 0) {
      ip.diag.add('unsupported-g-code', ip.lineNo, `G${w.g[k]} is not interpreted; the line is skipped`, ip.lineText);
      return false;
    }
    if (gSlot[group] >= 0) {
      ip.diag.add('modal-group-conflict', ip.lineNo, `G${gSlot[group] / 10} and G${code / 10} are in the same modal group; the line is skipped`, ip.lineText);
      return false;
    }
    gSlot[group] = code;
  }
  return true;
}

/** the line's M codes into mSlot by modal group (an unknown one is ignored); false, reported, for two of one group */
function readMCodes(ip: Interp): boolean {
  const w = ip.w;
  mSlot.fill(-1);
  for (let k = 0; k < w.mCount; k++) {
    const m = w.m[k];
    const group = Number.isInteger(m) ? mGroup(m) : -1;
    if (group < 0) {
      ip.diag.add('unsupported-m-code', ip.lineNo, `M${m} is not interpreted; it is ignored`, ip.lineText);
      continue;
    }
    const prev = mSlot[group];
    if (prev >= 0) {
      // NISTIR 6556 allows M7 and M8 together
      if (group === MGroup.coolant && prev + m === 15) continue;
      ip.diag.add('modal-group-conflict', ip.lineNo, `M${prev} and M${m} are in the same modal group; the line is skipped`, ip.lineText);
      return false;
    }
    mSlot[group] = m;
  }
  return true;
}

/** rotary axes and letters that are not RS274/NGC words: named, the rest of the line runs */
function reportIgnoredWords(ip: Interp): void {
  const w = ip.w;
  if (w.letterMask & 7) ip.diag.once('rotary-axis-ignored', ip.lineNo, 'A, B and C words (rotary axes) are not interpreted; the rest of the line is', ip.lineText);
  if (w.letterMask & IGNORED_LETTERS) {
    for (let letter = 0; letter < 26; letter++) {
      if ((IGNORED_LETTERS >> letter) & 1 && w.has(letter)) ip.diag.add('unsupported-word', ip.lineNo, `${String.fromCharCode(65 + letter)} words are not RS274/NGC words; ignored`, ip.lineText);
    }
  }
}

/** G20/G21 (before F, see the header), G93/G94, F, S, T */
function setUnitsFeedSpeedTool(ip: Interp): void {
  const w = ip.w;
  const units = gSlot[GGroup.units];
  if (units >= 0) {
    ip.inch = units === 200;
    ip.scale = ip.inch ? inchMm : 1;
    if (ip.declaredUnits === null) ip.declaredUnits = ip.inch ? 'inch' : 'mm';
  }
  const feedMode = gSlot[GGroup.feedMode];
  if (feedMode >= 0) ip.inverseTime = feedMode === 930;
  if (w.has(L.F) && !ip.inverseTime) ip.feedMmPerMin = w.value[L.F] * ip.scale;
  if (w.has(L.S)) ip.spindleRpm = w.value[L.S];
  if (w.has(L.T)) ip.selectedTool = w.value[L.T];
}

/** M6, then M3/M4/M5 and M7/M8/M9 */
function changeToolAndSpindle(ip: Interp): void {
  const d = ip.diag;
  const n = ip.lineNo;
  const t = ip.lineText;
  if (mSlot[MGroup.toolChange] >= 0) {
    if (ip.selectedTool < 0) d.add('tool-change-without-tool', n, 'M6 with no T selected; the tool is unknown', t);
    else ip.tool = ip.selectedTool;
    // NISTIR 6556 §3.6.3: when the change is complete the spindle is stopped (its speed stays
    // in force), so the next cut needs an M3/M4 and that start spins the spindle up again
    ip.spindleOn = false;
    ip.spindleCcw = false;
    ip.atRest(MoveKind.toolChange);
  }
  const spindle = mSlot[MGroup.spindle];
  if (spindle === 3 || spindle === 4) {
    if (!(ip.spindleRpm > 0)) d.add('spindle-speed-missing', n, `M${spindle} with no S speed in force`, t);
    const ccw = spindle === 4;
    if (!ip.spindleOn || ip.spindleCcw !== ccw) {
      ip.spindleOn = true;
      ip.spindleCcw = ccw;
      ip.atRest(MoveKind.spindleStart);
    }
  } else if (spindle === 5 && ip.spindleOn) {
    ip.spindleOn = false;
    ip.spindleCcw = false;
    ip.atRest(MoveKind.spindleStop);
  }
  const coolant = mSlot[MGroup.coolant];
  if (coolant >= 0) ip.coolant = coolant !== 9;
}

/** G4 P (seconds) */
function dwell(ip: Interp): void {
  if (gSlot[GGroup.nonModal] !== 40) return;
  const w = ip.w;
  if (!w.has(L.P)) ip.diag.add('dwell-missing-p', ip.lineNo, 'G4 needs P, the dwell in seconds', ip.lineText);
  else if (w.value[L.P] < 0) ip.diag.add('dwell-negative', ip.lineNo, `dwell P ${w.value[L.P]} is negative (NISTIR 6556 §3.5.4)`, ip.lineText);
  else ip.atRest(MoveKind.dwell, w.value[L.P]);
}

/** plane, cutter and length compensation, coordinate system, path mode, distance modes, retract mode */
function setModes(ip: Interp): void {
  const d = ip.diag;
  const n = ip.lineNo;
  const t = ip.lineText;
  const plane = gSlot[GGroup.plane];
  if (plane >= 0) ip.plane = plane === 170 ? 0 : plane === 180 ? 1 : 2;
  const comp = gSlot[GGroup.cutterComp];
  if (comp === 410 || comp === 420) d.once('cutter-compensation-ignored', n, `G${comp / 10}: the path is shown and timed as programmed, without cutter radius compensation`, t);
  if (gSlot[GGroup.lengthComp] === 430) d.once('length-compensation-ignored', n, 'G43: tool length offsets are not applied; Z is shown as programmed', t);
  const coord = gSlot[GGroup.coordSystem];
  if (coord > 540) d.once('work-offset-assumed-zero', n, `G${coord / 10}: offsets set at the machine are unknown, so it is taken as G54`, t);
  const path = gSlot[GGroup.pathMode];
  if (path >= 0) ip.exactStop = path !== 640;
  const dist = gSlot[GGroup.distance];
  if (dist >= 0) ip.absolute = dist === 900;
  const arcDist = gSlot[GGroup.arcDistance];
  if (arcDist >= 0) ip.arcAbsolute = arcDist === 901;
  const ret = gSlot[GGroup.returnMode];
  if (ret >= 0) ip.retractOldZ = ret === 980;
}

/** the motion mode, then the axis words: G28/G30, G10, G92 (and its clearing), G53, or the motion in force */
function motionAndOffsets(ip: Interp): void {
  const d = ip.diag;
  const n = ip.lineNo;
  const t = ip.lineText;
  const nonModal = gSlot[GGroup.nonModal];
  const motionG = gSlot[GGroup.motion];
  if (motionG >= 0) {
    if (motionG < 730 || motionG === 800) {
      ip.cycZ = ip.cycR = ip.cycP = ip.cycQ = NaN;
    } else if (motionG !== ip.motion) {
      ip.cycP = ip.cycQ = NaN;
    }
    ip.motion = motionG;
  }
  const usesAxes = nonModal === 280 || nonModal === 300 || nonModal === 100 || nonModal === 920;
  if (usesAxes) {
    if (motionG >= 0 && motionG !== 800 && ip.hasAxisWords()) {
      d.add('axis-word-conflict', n, `G${nonModal / 10} and G${motionG / 10} both use the axis words; only G${nonModal / 10} is applied`, t);
    }
    if (nonModal === 280 || nonModal === 300) homeMove(ip, nonModal === 300);
    else if (nonModal === 100) d.add('g10-unsupported', n, 'G10 (setting offsets or tool data) is not interpreted; ignored', t);
    else setAxisOffsets(ip);
  } else if (nonModal === 921 || nonModal === 922) {
    ip.g92x = ip.g92y = ip.g92z = 0;
  } else if (nonModal === 530) {
    if (ip.motion !== 0 && ip.motion !== 10) d.add('axis-word-conflict', n, 'G53 needs G0 or G1 in force; the move is skipped', t);
    else if (ip.hasAxisWords()) machineMove(ip, ip.motion === 0 ? 0 : 1);
  } else {
    runMotion(ip, motionG >= 0);
  }
}

function runMotion(ip: Interp, explicit: boolean): void {
  const w = ip.w;
  const mode = ip.motion;
  const hasAxes = ip.hasAxisWords();
  if (mode === 0 || mode === 10) {
    if (hasAxes) straightMove(ip, mode === 0 ? 0 : 1);
  } else if (mode === 20 || mode === 30) {
    if (hasAxes || explicit || w.has(L.I) || w.has(L.J) || w.has(L.K) || w.has(L.R)) arcMove(ip, mode === 30);
  } else if (mode === 800) {
    if (hasAxes) ip.diag.add('axis-words-with-g80', ip.lineNo, 'axis words with no motion mode in force (G80); the line is skipped', ip.lineText);
  } else if (hasAxes) {
    cannedCycle(ip, mode);
  }
}

/** G92: the current point gets the given coordinates */
function setAxisOffsets(ip: Interp): void {
  const w = ip.w;
  if (w.has(L.X)) ip.g92x = ip.x - w.value[L.X] * ip.scale;
  if (w.has(L.Y)) ip.g92y = ip.y - w.value[L.Y] * ip.scale;
  if (w.has(L.Z)) ip.g92z = ip.z - w.value[L.Z] * ip.scale;
}

/** M2/M30 (NISTIR 6556 §3.6.1): G17 G90 G94 G54, G92 offsets cleared, M5, M9, motion G1 */
function endProgram(ip: Interp): void {
  ip.plane = 0;
  ip.absolute = true;
  ip.inverseTime = false;
  ip.g92x = ip.g92y = ip.g92z = 0;
  ip.spindleOn = false;
  ip.spindleCcw = false;
  ip.coolant = false;
  ip.motion = 10;
  ip.cycZ = ip.cycR = ip.cycP = ip.cycQ = NaN;
  ip.atRest(MoveKind.programEnd);
  ip.ended = true;
}
