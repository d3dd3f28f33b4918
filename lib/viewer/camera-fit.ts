// Camera placement for the preset views and for "fit": the distance at which a box's bounding
// sphere just fills a perspective camera's narrower field of view. For a sphere of radius r
// and a half-angle θ the tangent lines from the eye touch it at distance d = r / sin θ
// (right triangle eye–centre–tangent point); the narrower of the vertical field and the
// horizontal one (tan θh = aspect · tan θv) decides. Z is up, as on the machine.

export interface Box3Like {
  minX: number;
  minY: number;
  minZ: number;
  maxX: number;
  maxY: number;
  maxZ: number;
}

export const PRESET_VIEWS = ['top', 'front', 'side', 'iso'] as const;
export type PresetView = (typeof PRESET_VIEWS)[number];
export const PRESET_LABELS: Record<PresetView, string> = { top: 'Top', front: 'Front', side: 'Side', iso: 'Iso' };

/**
 * Unit vector from the target towards the eye for each preset (Z up; front looks along +Y).
 * Top is tilted a thousandth of a radian towards −Y: looking exactly along the up vector leaves
 * the orbit's azimuth undefined, so the picture could turn at random.
 */
export const VIEW_DIRECTIONS: Record<PresetView, [number, number, number]> = {
  top: [0, -Math.sin(1e-3), Math.cos(1e-3)],
  front: [0, -1, 0],
  side: [1, 0, 0],
  iso: [1 / Math.sqrt(3), -1 / Math.sqrt(3), 1 / Math.sqrt(3)],
};

export function boxCentre(b: Box3Like): [number, number, number] {
  return [(b.minX + b.maxX) / 2, (b.minY + b.maxY) / 2, (b.minZ + b.maxZ) / 2];
}

export function boxRadius(b: Box3Like): number {
  const dx = b.maxX - b.minX;
  const dy = b.maxY - b.minY;
  const dz = b.maxZ - b.minZ;
  return Math.sqrt(dx * dx + dy * dy + dz * dz) / 2;
}

/** eye distance from the centre so the box's sphere fits the view, with a margin (1 = touching) */
export function fitDistance(radius: number, verticalFovDeg: number, aspect: number, margin = 1.1): number {
  const halfV = (verticalFovDeg * Math.PI) / 360;
  const halfH = Math.atan(Math.tan(halfV) * aspect);
  const half = Math.min(halfV, halfH);
  return (Math.max(radius, 1e-3) / Math.sin(half)) * margin;
}

export interface CameraPlacement {
  position: [number, number, number];
  target: [number, number, number];
}

export function placeCamera(box: Box3Like, view: PresetView, verticalFovDeg: number, aspect: number): CameraPlacement {
  const target = boxCentre(box);
  const d = fitDistance(boxRadius(box), verticalFovDeg, aspect);
  const [ux, uy, uz] = VIEW_DIRECTIONS[view];
  return {
    position: [target[0] + ux * d, target[1] + uy * d, target[2] + uz * d],
    target,
  };
}
