'use client';
// Markers over the path: plunge points as cones pointing down, tool changes as cubes, moves on
// a finding's line as rings of the finding colour (instanced: one draw call per kind however
// many), and the parts outlined at the stock top (their box, as the analysis reports it) and
// numbered in the order they come free; parts a finding names are outlined in its colour, and
// while the program page shows a hold-down method each part is outlined and marked held or not.
// Numbers are DOM labels in the page's shipped font (next/font/local), never a fetched font.
import { Html } from '@react-three/drei';
import { useLayoutEffect, useMemo, useRef, useSyncExternalStore } from 'react';
import * as THREE from 'three';
import { holdOverlay, selectedMethod } from '@/lib/viewer/hold-overlay';
import { PATH_COLOURS } from '@/lib/viewer/palette';

export interface MarkerPoint {
  x: number;
  y: number;
  z: number;
}

function Instanced({ points, geometry, colour, size }: { points: readonly MarkerPoint[]; geometry: THREE.BufferGeometry; colour: string; size: number }) {
  const ref = useRef<THREE.InstancedMesh>(null);
  useLayoutEffect(() => {
    const mesh = ref.current;
    if (!mesh) return;
    const m = new THREE.Matrix4();
    const s = new THREE.Vector3(size, size, size);
    const q = new THREE.Quaternion();
    points.forEach((p, i) => mesh.setMatrixAt(i, m.compose(new THREE.Vector3(p.x, p.y, p.z), q, s)));
    mesh.instanceMatrix.needsUpdate = true;
    mesh.computeBoundingSphere();
  }, [points, size]);
  if (points.length === 0) return null;
  return (
    <instancedMesh ref={ref} args={[geometry, undefined, points.length]} frustumCulled={false}>
      <meshBasicMaterial color={colour} />
    </instancedMesh>
  );
}

export function Markers({ plunges, toolChanges, findings, size }: { plunges: MarkerPoint[]; toolChanges: MarkerPoint[]; findings: MarkerPoint[]; size: number }) {
  const geometries = useMemo(() => {
    // a cone with its tip at the origin, pointing down −Z
    const cone = new THREE.ConeGeometry(0.5, 1.4, 10);
    cone.rotateX(Math.PI / 2);
    cone.translate(0, 0, 0.7);
    const cube = new THREE.BoxGeometry(1, 1, 1);
    cube.translate(0, 0, 0.5);
    const ring = new THREE.TorusGeometry(0.8, 0.16, 6, 20);
    return { cone, cube, ring };
  }, []);
  return (
    <>
      <Instanced points={plunges} geometry={geometries.cone} colour={PATH_COLOURS.plunge} size={size} />
      <Instanced points={toolChanges} geometry={geometries.cube} colour={PATH_COLOURS.tool} size={size * 1.2} />
      <Instanced points={findings} geometry={geometries.ring} colour={PATH_COLOURS.finding} size={size * 1.3} />
    </>
  );
}

export interface PartOutline {
  id: number;
  order: number;
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  flagged: boolean;
}

/** labels are DOM elements: past this many the numbers are left to the parts table */
const MAX_LABELS = 250;

/** outline of a part the chosen hold-down method holds (a not-held one takes the finding colour) */
const HELD_OUTLINE = '#7fc8a9';

export function PartOutlines({ parts, z }: { parts: PartOutline[]; z: number }) {
  // the program page's hold-down method (lib/viewer/hold-overlay.ts): held or not held per part,
  // in the outline's colour and, so colour is not the only signal, a mark on the number
  const overlay = useSyncExternalStore(holdOverlay.subscribe, holdOverlay.getSnapshot, holdOverlay.getSnapshot);
  const method = selectedMethod(overlay);
  const geometry = useMemo(() => {
    const pos: number[] = [];
    const col: number[] = [];
    const plain = new THREE.Color(PATH_COLOURS.part);
    const flagged = new THREE.Color(PATH_COLOURS.finding);
    const held = new THREE.Color(HELD_OUTLINE);
    for (const p of parts) {
      const verdict = method?.verdicts.get(p.id);
      const c = verdict ? (verdict.held ? held : flagged) : p.flagged ? flagged : plain;
      const corners = [
        [p.minX, p.minY],
        [p.maxX, p.minY],
        [p.maxX, p.maxY],
        [p.minX, p.maxY],
      ];
      for (let k = 0; k < 4; k++) {
        const a = corners[k];
        const b = corners[(k + 1) % 4];
        pos.push(a[0], a[1], z, b[0], b[1], z);
        col.push(c.r, c.g, c.b, c.r, c.g, c.b);
      }
    }
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.Float32BufferAttribute(pos, 3));
    g.setAttribute('color', new THREE.Float32BufferAttribute(col, 3));
    return g;
  }, [parts, z, method]);
  return (
    <group>
      <lineSegments geometry={geometry}>
        <lineBasicMaterial vertexColors transparent opacity={0.9} />
      </lineSegments>
      {parts.slice(0, MAX_LABELS).map((p) => {
        const verdict = method?.verdicts.get(p.id);
        const look = verdict
          ? verdict.held
            ? 'border-ok bg-ok-tint text-ok'
            : 'border-fault bg-fault-tint text-fault'
          : p.flagged
            ? 'border-fault bg-fault-tint text-fault'
            : 'border-night-edge bg-night/85 text-white';
        return (
          <Html key={p.id} position={[(p.minX + p.maxX) / 2, (p.minY + p.maxY) / 2, z]} center zIndexRange={[8, 0]} className="pointer-events-none">
            <span data-part-label={p.order} data-hold={verdict ? (verdict.held ? 'held' : 'not-held') : undefined} className={`figure rounded-full border-2 px-1.5 text-xs font-bold ${look}`}>
              {verdict ? (verdict.held ? '✓' : '✕') : ''}
              {p.order}
            </span>
          </Html>
        );
      })}
    </group>
  );
}
