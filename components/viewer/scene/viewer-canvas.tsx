'use client';
// The one client Canvas of the viewer (loaded with next/dynamic, ssr: false): renders only on
// demand (a change, a camera move, a playback frame), on the dark `night` ground, Z up.
import { Canvas, useThree } from '@react-three/fiber';
import { useEffect } from 'react';
import type { ColourMode } from '@/lib/viewer/colour-map';
import type { MoveList, Xyz } from '@/lib/gcode/move-list';
import type { ViewerPath } from '@/lib/viewer/path-build';
import type { PlaybackStore } from '../playback-store';
import { CameraRig, type ViewRequest } from './camera-rig';
import { Markers, PartOutlines, type MarkerPoint, type PartOutline } from './markers';
import { PathLines, type PathFilters } from './path-lines';
import { Stock, type StockProps } from './stock';
import { ToolMarker } from './tool-marker';

export interface ViewerCanvasProps {
  moves: MoveList;
  path: ViewerPath;
  store: PlaybackStore;
  stock: StockProps;
  mode: ColourMode;
  filters: PathFilters;
  request: ViewRequest | null;
  plunges: MarkerPoint[];
  toolChanges: MarkerPoint[];
  findingPoints: MarkerPoint[];
  parts: PartOutline[];
  markerSizeMm: number;
  dashMm: number;
  toolDiameterMm: (tool: number) => number;
  onToolPosition?: (p: Xyz) => void;
}

/** playback and panel changes ask the demand-driven loop for a frame */
function Invalidator({ store }: { store: PlaybackStore }) {
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => store.listenFrames(() => invalidate()), [store, invalidate]);
  return null;
}

export default function ViewerCanvas(props: ViewerCanvasProps) {
  return (
    <Canvas
      frameloop="demand"
      camera={{ up: [0, 0, 1], fov: 40, near: 0.5, far: 100_000, position: [0, -1000, 1000] }}
      gl={{ preserveDrawingBuffer: true, antialias: true }}
      dpr={[1, 2]}
      data-testid="viewer-canvas"
      aria-label="3D view of the toolpath over the sheet"
      role="img"
    >
      <color attach="background" args={['#1b2026']} />
      <ambientLight intensity={1.4} />
      <directionalLight position={[1, -1, 2]} intensity={1.2} />
      <Invalidator store={props.store} />
      <Stock {...props.stock} />
      <PathLines path={props.path} store={props.store} mode={props.mode} filters={props.filters} dashMm={props.dashMm} />
      <Markers plunges={props.plunges} toolChanges={props.toolChanges} findings={props.findingPoints} size={props.markerSizeMm} />
      <PartOutlines parts={props.parts} z={props.stock.stockTopZ + 0.2} />
      <ToolMarker moves={props.moves} store={props.store} diameterMm={props.toolDiameterMm} onPosition={props.onToolPosition} />
      <CameraRig request={props.request} />
    </Canvas>
  );
}
