// Modal groups of G and M codes after NISTIR 6556 Table 4 (§3.4), indexed by the code times
// ten (G90.1 → 901), so one line's words can be checked for two of one group (§3.3.5).
// G73 is not in NISTIR 6556; it is accepted as a dialect extension in the motion group.
// G90.1/G91.1 (arc-centre distance mode) are an extension with a group of their own.

export const GGroup = {
  nonModal: 0,
  motion: 1,
  plane: 2,
  distance: 3,
  arcDistance: 4,
  feedMode: 5,
  units: 6,
  cutterComp: 7,
  lengthComp: 8,
  returnMode: 10,
  coordSystem: 12,
  pathMode: 13,
} as const;
export const G_GROUP_SLOTS = 14;

export const MGroup = { stop: 0, toolChange: 1, spindle: 2, coolant: 3, override: 4 } as const;
export const M_GROUP_SLOTS = 5;

const gTable = new Int8Array(1000).fill(-1);
function g(group: number, ...codes: number[]): void {
  for (const c of codes) gTable[Math.round(c * 10)] = group;
}
g(GGroup.nonModal, 4, 10, 28, 30, 53, 92, 92.1, 92.2);
g(GGroup.motion, 0, 1, 2, 3, 73, 80, 81, 82, 83, 84, 85, 86, 87, 88, 89);
g(GGroup.plane, 17, 18, 19);
g(GGroup.distance, 90, 91);
g(GGroup.arcDistance, 90.1, 91.1);
g(GGroup.feedMode, 93, 94);
g(GGroup.units, 20, 21);
g(GGroup.cutterComp, 40, 41, 42);
g(GGroup.lengthComp, 43, 49);
g(GGroup.returnMode, 98, 99);
g(GGroup.coordSystem, 54, 55, 56, 57, 58, 59);
g(GGroup.pathMode, 61, 61.1, 64);

/** the group of G code `tenths` (code × 10, rounded), or -1 when the engine does not know it */
export function gGroup(tenths: number): number {
  return tenths >= 0 && tenths < 1000 ? gTable[tenths] : -1;
}

/** the group of M code m (an integer), or -1 */
export function mGroup(m: number): number {
  switch (m) {
    case 0:
    case 1:
    case 2:
    case 30:
    case 60:
      return MGroup.stop;
    case 6:
      return MGroup.toolChange;
    case 3:
    case 4:
    case 5:
      return MGroup.spindle;
    case 7:
    case 8:
    case 9:
      return MGroup.coolant;
    case 48:
    case 49:
      return MGroup.override;
    default:
      return -1;
  }
}
