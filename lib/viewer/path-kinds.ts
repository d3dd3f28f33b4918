// What the viewer calls each move, for colour and filters: rapid, cut, plunge, air move, or a
// record with no motion (dwell, tool change, spindle, stop). The rule is the planner's own
// (lib/kinematics/block-feed.ts): a feed going down more steeply than 45° is a plunge, else it
// cuts when any part of it lies below the stock top, else it is an air move.
export const ViewKind = { rapid: 0, cut: 1, plunge: 2, air: 3, still: 4 } as const;
export type ViewKindCode = (typeof ViewKind)[keyof typeof ViewKind];
export const VIEW_KIND_KEYS = ['rapid', 'cut', 'plunge', 'air', 'still'] as const;
export type ViewKindKey = (typeof VIEW_KIND_KEYS)[number];

/** the kind of a straight feed move from (x0,y0,z0) to (x1,y1,z1) */
export function feedKind(x0: number, y0: number, z0: number, x1: number, y1: number, z1: number, stockTopZ: number): ViewKindCode {
  const dx = x1 - x0;
  const dy = y1 - y0;
  const dz = z1 - z0;
  if (dz < 0 && dz * dz > dx * dx + dy * dy) return ViewKind.plunge;
  return (z0 < z1 ? z0 : z1) < stockTopZ ? ViewKind.cut : ViewKind.air;
}
