'use client';
// Orbit, pan and zoom (drei's OrbitControls, Z up as on the machine), and the camera moves the
// panels ask for: a preset view of a box (top, front, side, iso), fit to the sheet or the
// path, or focus on a part or a point. The maths is lib/viewer/camera-fit.ts.
import { OrbitControls } from '@react-three/drei';
import { useThree } from '@react-three/fiber';
import { useEffect, useRef } from 'react';
import * as THREE from 'three';
import type { OrbitControls as OrbitControlsImpl } from 'three-stdlib';
import { placeCamera, type Box3Like, type PresetView } from '@/lib/viewer/camera-fit';

export interface ViewRequest {
  box: Box3Like;
  view: PresetView | 'keep';
  /** a new number every request, so the same request twice moves the camera twice */
  nonce: number;
}

export function CameraRig({ request }: { request: ViewRequest | null }) {
  const camera = useThree((s) => s.camera) as THREE.PerspectiveCamera;
  const size = useThree((s) => s.size);
  const invalidate = useThree((s) => s.invalidate);
  const controls = useRef<OrbitControlsImpl>(null);

  useEffect(() => {
    if (!request) return;
    const c = controls.current;
    let view: PresetView = request.view === 'keep' ? 'iso' : request.view;
    if (request.view === 'keep' && c) {
      // keep the direction the user is looking from, only move to the box
      const dir = camera.position.clone().sub(c.target).normalize();
      const place = placeCamera(request.box, 'iso', camera.fov, size.width / Math.max(1, size.height));
      const d = new THREE.Vector3(...place.position).distanceTo(new THREE.Vector3(...place.target));
      c.target.set(...place.target);
      camera.position.copy(c.target).addScaledVector(dir, d);
      finish(camera, c, d);
      invalidate();
      return;
    }
    view = view ?? 'iso';
    const place = placeCamera(request.box, view, camera.fov, size.width / Math.max(1, size.height));
    camera.position.set(...place.position);
    const d = new THREE.Vector3(...place.position).distanceTo(new THREE.Vector3(...place.target));
    if (c) c.target.set(...place.target);
    camera.lookAt(...place.target);
    finish(camera, c, d);
    invalidate();
    // the camera follows requests only, not resizes
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [request]);

  return <OrbitControls ref={controls} makeDefault enableDamping={false} screenSpacePanning />;
}

function finish(camera: THREE.PerspectiveCamera, c: OrbitControlsImpl | null, distance: number) {
  camera.near = Math.max(0.05, distance / 2000);
  camera.far = distance * 50;
  camera.updateProjectionMatrix();
  c?.update();
}
