'use client';
// The whole path as one set of GPU buffers (positions, colours, dash distances, tags) of one
// line strip, shared by two line objects: the path already cut (full colour) and the path to come
// (dimmed), split by each geometry's draw range, which every frame's playhead moves. A change
// of colour mode writes a new colour buffer; nothing else is ever rebuilt. Once the GPU holds
// a buffer the page's copy is let go (three.js onUpload): the vertices of a big program are
// hundreds of megabytes, and nothing on the page reads them back.
import { useFrame } from '@react-three/fiber';
import { useEffect, useMemo, useRef } from 'react';
import * as THREE from 'three';
import { colourPath, type ColourMode } from '@/lib/viewer/colour-map';
import { releaseVertexBuffers, vertexCountOf, type ViewerPath } from '@/lib/viewer/path-build';
import { doneSegmentCount, stripRanges } from '@/lib/viewer/playhead';
import type { PlaybackStore } from '../playback-store';
import { createPathMaterial, createSharedUniforms, MAX_TOOL_SLOTS } from './path-material';

export interface PathFilters {
  showRapids: boolean;
  hiddenTools: ReadonlySet<number>;
  zRange: [number, number];
  onlyFindings: boolean;
  markFindings: boolean;
}

/** a colour buffer for a colour mode, uploaded once, then let go (see onUpload below) */
function applyColours(path: ViewerPath, mode: ColourMode, colour: THREE.BufferAttribute, vertexCount: number): void {
  colour.array = colourPath(path, mode, new Uint8Array(vertexCount * 3));
  colour.needsUpdate = true;
}

function applyFilters(shared: ReturnType<typeof createSharedUniforms>, filters: PathFilters, tools: number[], dashMm: number): void {
  shared.uShowRapids.value = filters.showRapids ? 1 : 0;
  shared.uOnlyFindings.value = filters.onlyFindings ? 1 : 0;
  shared.uMarkFindings.value = filters.markFindings ? 1 : 0;
  const hidden = shared.uToolHidden.value;
  for (let i = 0; i < MAX_TOOL_SLOTS; i++) hidden[i] = filters.hiddenTools.has(tools[i]) ? 1 : 0;
  shared.uZRange.value.set(filters.zRange[0] - 1e-6, filters.zRange[1] + 1e-6);
  shared.uDashMm.value = dashMm;
}

export function PathLines({ path, store, mode, filters, dashMm }: { path: ViewerPath; store: PlaybackStore; mode: ColourMode; filters: PathFilters; dashMm: number }) {
  const shared = useMemo(() => createSharedUniforms(), []);
  const { done, ahead, colour, vertexCount } = useMemo(() => {
    const vertexCount = vertexCountOf(path);
    const position = new THREE.BufferAttribute(path.positions, 3);
    // its first contents come with the colour mode's effect, before the first frame
    const colourAttr = new THREE.BufferAttribute(new Uint8Array(vertexCount * 3), 3, true);
    const dash = new THREE.BufferAttribute(path.dash, 1);
    const tag = new THREE.BufferAttribute(path.tag, 2);
    // the GPU has them: drop the page's copies (the path's too), keeping the counts
    let uploaded = 0;
    const released = () => {
      uploaded++;
      if (uploaded < 3) return;
      position.array = new Float32Array(0);
      dash.array = new Float32Array(0);
      tag.array = new Uint8Array(0);
      releaseVertexBuffers(path);
    };
    position.onUpload(released);
    dash.onUpload(released);
    tag.onUpload(released);
    colourAttr.onUpload(() => {
      colourAttr.array = new Uint8Array(0);
    });
    const make = () => {
      const g = new THREE.BufferGeometry();
      g.setAttribute('position', position);
      g.setAttribute('rgb', colourAttr);
      g.setAttribute('dash', dash);
      g.setAttribute('tag', tag);
      const b = path.bounds;
      if (b) {
        g.boundingBox = new THREE.Box3(new THREE.Vector3(b.minX, b.minY, b.minZ), new THREE.Vector3(b.maxX, b.maxY, b.maxZ));
        g.boundingSphere = g.boundingBox.getBoundingSphere(new THREE.Sphere());
      }
      return g;
    };
    return { done: make(), ahead: make(), colour: colourAttr, vertexCount };
  }, [path]);
  const materials = useMemo(() => ({ done: createPathMaterial(shared, 0), ahead: createPathMaterial(shared, 0.72) }), [shared]);
  const lines = useMemo(() => {
    const d = new THREE.Line(done, materials.done);
    const a = new THREE.Line(ahead, materials.ahead);
    d.frustumCulled = false;
    a.frustumCulled = false;
    return { done: d, ahead: a };
  }, [done, ahead, materials]);

  useEffect(() => applyColours(path, mode, colour, vertexCount), [path, mode, colour, vertexCount]);
  useEffect(() => applyFilters(shared, filters, path.tools, dashMm), [filters, shared, path, dashMm]);

  useEffect(
    () => () => {
      done.dispose();
      ahead.dispose();
      materials.done.dispose();
      materials.ahead.dispose();
    },
    [done, ahead, materials],
  );

  const last = useRef(-1);
  useFrame(() => {
    const snap = store.snapshot;
    const count = doneSegmentCount(path.moveSegStart, snap.move, store.fraction);
    if (count === last.current) return;
    last.current = count;
    const r = stripRanges(count, Math.max(0, vertexCount - 1));
    done.setDrawRange(r.done[0], r.done[1]);
    ahead.setDrawRange(r.ahead[0], r.ahead[1]);
  });

  return (
    <>
      <primitive object={lines.done} />
      <primitive object={lines.ahead} />
    </>
  );
}
