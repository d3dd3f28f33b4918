'use client';
// The real setting of the program: the sheet as a see-through solid of its size and thickness
// at its place (G54's origin at the sheet's lower left corner, common practice for nested
// sheets), the spoilboard plane under it, the machine's travel as a faint box from the work
// origin, and the work origin with its X, Y and Z arms.
import { Html } from '@react-three/drei';
import { useMemo } from 'react';
import * as THREE from 'three';
import { PATH_COLOURS } from '@/lib/viewer/palette';

export interface StockProps {
  sheet: { widthMm: number; lengthMm: number; thicknessMm: number } | null;
  stockTopZ: number;
  travelMm: { x: number; y: number; z: number };
  originArmMm: number;
}

export function Stock({ sheet, stockTopZ, travelMm, originArmMm }: StockProps) {
  const bottomZ = sheet ? stockTopZ - sheet.thicknessMm : stockTopZ;
  const travel = useMemo(() => {
    const box = new THREE.BoxGeometry(travelMm.x, travelMm.y, travelMm.z);
    box.translate(travelMm.x / 2, travelMm.y / 2, bottomZ + travelMm.z / 2);
    const edges = new THREE.EdgesGeometry(box);
    box.dispose();
    return edges;
  }, [travelMm, bottomZ]);
  const origin = useMemo(() => {
    const g = new THREE.BufferGeometry();
    const a = originArmMm;
    g.setAttribute('position', new THREE.Float32BufferAttribute([0, 0, stockTopZ, a, 0, stockTopZ, 0, 0, stockTopZ, 0, a, stockTopZ, 0, 0, stockTopZ, 0, 0, stockTopZ + a], 3));
    return g;
  }, [originArmMm, stockTopZ]);

  return (
    <group>
      {sheet ? (
        <mesh position={[sheet.widthMm / 2, sheet.lengthMm / 2, stockTopZ - sheet.thicknessMm / 2]} renderOrder={-1}>
          <boxGeometry args={[sheet.widthMm, sheet.lengthMm, sheet.thicknessMm]} />
          <meshLambertMaterial color={PATH_COLOURS.sheet} transparent opacity={0.32} depthWrite={false} />
        </mesh>
      ) : null}
      <mesh position={[travelMm.x / 2, travelMm.y / 2, bottomZ - 0.5]} renderOrder={-2}>
        <planeGeometry args={[travelMm.x, travelMm.y]} />
        <meshBasicMaterial color={PATH_COLOURS.spoilboard} transparent opacity={0.85} depthWrite={false} side={THREE.DoubleSide} />
      </mesh>
      <lineSegments geometry={travel}>
        <lineBasicMaterial color={PATH_COLOURS.travel} transparent opacity={0.45} />
      </lineSegments>
      <lineSegments geometry={origin}>
        <lineBasicMaterial color={PATH_COLOURS.tool} />
      </lineSegments>
      <Html position={[0, 0, stockTopZ]} zIndexRange={[5, 0]} className="pointer-events-none">
        <span className="whitespace-nowrap rounded bg-night/80 px-1 text-xs text-white">origin</span>
      </Html>
      <Html position={[originArmMm, 0, stockTopZ]} zIndexRange={[5, 0]} className="pointer-events-none">
        <span className="text-xs font-bold text-white">X</span>
      </Html>
      <Html position={[0, originArmMm, stockTopZ]} zIndexRange={[5, 0]} className="pointer-events-none">
        <span className="text-xs font-bold text-white">Y</span>
      </Html>
    </group>
  );
}
