'use client';
// The tool at its place on the planner's clock: a cylinder of the tool's diameter standing on
// the interpolated point of the move running at the playhead (straight or on the arc).
import { useFrame } from '@react-three/fiber';
import { useRef } from 'react';
import type * as THREE from 'three';
import type { MoveList, Xyz } from '@/lib/gcode/move-list';
import { PATH_COLOURS } from '@/lib/viewer/palette';
import { toolPositionAt } from '@/lib/viewer/playhead';
import type { PlaybackStore } from '../playback-store';

export function ToolMarker({ moves, store, diameterMm, onPosition }: { moves: MoveList; store: PlaybackStore; diameterMm: (tool: number) => number; onPosition?: (p: Xyz) => void }) {
  const ref = useRef<THREE.Group>(null);
  const point = useRef<Xyz>({ x: 0, y: 0, z: 0 });
  useFrame(() => {
    const g = ref.current;
    if (!g) return;
    const snap = store.snapshot;
    const p = toolPositionAt(moves, snap.move, store.fraction, point.current);
    g.position.set(p.x, p.y, p.z);
    const d = Math.max(1, diameterMm(snap.move >= 0 ? moves.tool[snap.move] : 0));
    g.scale.set(d, d, d);
    onPosition?.(p);
  });
  return (
    <group ref={ref}>
      <mesh position={[0, 0, 4]} rotation={[Math.PI / 2, 0, 0]}>
        <cylinderGeometry args={[0.5, 0.5, 8, 16]} />
        <meshBasicMaterial color={PATH_COLOURS.tool} transparent opacity={0.8} />
      </mesh>
    </group>
  );
}
