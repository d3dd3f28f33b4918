// The path's shader, drawing the one line strip: each segment's colour, tag and visibility
// are flat, taken from its last vertex (WebGL 2's provoking vertex, path-build.ts); rapids
// dashed (a distance along the run of rapids per vertex, every other dash length left out), filters as uniforms (rapids off, tools hidden, a Z range,
// only the moves on findings' lines), findings marked in their own colour, and a dimmed
// version for the path still to come while playing. Filters change uniforms, never buffers.
import * as THREE from 'three';
import { hexToRgb, PATH_COLOURS } from '@/lib/viewer/palette';

export const MAX_TOOL_SLOTS = 32;

const vertexShader = /* glsl */ `
attribute vec3 rgb;
attribute float dash;
attribute vec2 tag;
uniform float uShowRapids;
uniform float uOnlyFindings;
uniform float uMarkFindings;
uniform float uToolHidden[${MAX_TOOL_SLOTS}];
uniform vec3 uFindingColour;
flat varying vec3 vColour;
flat varying float vRapid;
flat varying float vHidden;
varying float vDash;
varying float vZ;
void main() {
  float rapid = mod(tag.y, 2.0);
  float finding = mod(floor(tag.y / 2.0), 2.0);
  int slot = int(tag.x);
  float toolHidden = slot < ${MAX_TOOL_SLOTS} ? uToolHidden[slot] : 0.0;
  vHidden = max(max(rapid * (1.0 - uShowRapids), toolHidden), uOnlyFindings * (1.0 - finding));
  vColour = mix(rgb, uFindingColour, finding * uMarkFindings);
  vRapid = rapid;
  vDash = dash;
  vZ = position.z;
  gl_Position = projectionMatrix * modelViewMatrix * vec4(position, 1.0);
}
`;

const fragmentShader = /* glsl */ `
uniform float uDashMm;
uniform vec2 uZRange;
uniform float uDim;
uniform vec3 uDimColour;
flat varying vec3 vColour;
flat varying float vRapid;
flat varying float vHidden;
varying float vDash;
varying float vZ;
void main() {
  if (vHidden > 0.5) discard;
  if (vZ < uZRange.x || vZ > uZRange.y) discard;
  if (vRapid > 0.5 && mod(vDash, 2.0 * uDashMm) > uDashMm) discard;
  gl_FragColor = vec4(mix(vColour, uDimColour, uDim), 1.0);
}
`;

function colour(hex: string): THREE.Color {
  const [r, g, b] = hexToRgb(hex);
  return new THREE.Color(r / 255, g / 255, b / 255);
}

export type PathUniforms = {
  uShowRapids: { value: number };
  uOnlyFindings: { value: number };
  uMarkFindings: { value: number };
  uToolHidden: { value: number[] };
  uFindingColour: { value: THREE.Color };
  uDashMm: { value: number };
  uZRange: { value: THREE.Vector2 };
  uDim: { value: number };
  uDimColour: { value: THREE.Color };
};

/** the filter uniforms, shared by the done and to-come materials */
export function createSharedUniforms(): Omit<PathUniforms, 'uDim' | 'uDimColour'> {
  return {
    uShowRapids: { value: 1 },
    uOnlyFindings: { value: 0 },
    uMarkFindings: { value: 1 },
    uToolHidden: { value: new Array<number>(MAX_TOOL_SLOTS).fill(0) },
    uFindingColour: { value: colour(PATH_COLOURS.finding) },
    uDashMm: { value: 4 },
    uZRange: { value: new THREE.Vector2(-1e9, 1e9) },
  };
}

export function createPathMaterial(shared: ReturnType<typeof createSharedUniforms>, dim: number): THREE.ShaderMaterial {
  return new THREE.ShaderMaterial({
    uniforms: { ...shared, uDim: { value: dim }, uDimColour: { value: colour(PATH_COLOURS.done) } },
    vertexShader,
    fragmentShader,
  });
}
