'use client';
// The playhead, shared by the scene (read every frame, no React render) and the panels (through
// useSyncExternalStore, at most a few times a second while playing). Time is the planner's
// clock (cumulativeS); the move is the one running then (moveAtTime) or the one a jump chose;
// the line is the source line shown, which a jump to a line without a move keeps as asked.
import { useSyncExternalStore } from 'react';
import { fractionAt, moveAtLine, moveAtTime } from '@/lib/viewer/playhead';

export interface PlaybackSnapshot {
  t: number;
  move: number;
  line: number;
  playing: boolean;
  speed: number;
}

export const PLAYBACK_SPEEDS = [1, 2, 5, 10, 20, 50, 100, 200, 500] as const;

export class PlaybackStore {
  private snap: PlaybackSnapshot;
  private listeners = new Set<() => void>();
  private frame = 0;
  private lastTick = 0;
  private lastEmit = 0;
  /** called on every change, also while playing (the scene asks for a new frame) */
  private onChange: (() => void) | null = null;
  /** wall-clock ms between animation frames while playing (the benchmark reads them) */
  frameTimesMs: number[] = [];

  constructor(
    private readonly cumulativeS: Float64Array,
    private readonly lines: Uint32Array,
  ) {
    const last = cumulativeS.length - 1;
    this.snap = { t: this.totalS, move: last, line: last >= 0 ? lines[last] : 0, playing: false, speed: 10 };
  }

  get totalS(): number {
    return this.cumulativeS.length ? this.cumulativeS[this.cumulativeS.length - 1] : 0;
  }

  get snapshot(): PlaybackSnapshot {
    return this.snap;
  }

  /** share of the current move done */
  get fraction(): number {
    return this.snap.move < 0 ? 0 : fractionAt(this.cumulativeS, this.snap.move, this.snap.t);
  }

  /** the scene's frame request, called on every change; returns the unsubscribe */
  listenFrames(fn: () => void): () => void {
    this.onChange = fn;
    return () => {
      if (this.onChange === fn) this.onChange = null;
    };
  }

  subscribe = (fn: () => void) => {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  };

  getSnapshot = () => this.snap;

  private set(next: Partial<PlaybackSnapshot>, emit = true) {
    this.snap = { ...this.snap, ...next };
    this.onChange?.();
    if (emit) {
      this.lastEmit = performance.now();
      for (const fn of this.listeners) fn();
    }
  }

  seek(t: number) {
    const clamped = Math.min(this.totalS, Math.max(0, t));
    const move = moveAtTime(this.cumulativeS, clamped);
    this.set({ t: clamped, move, line: move >= 0 ? this.lines[move] : 0 });
  }

  /** the playhead to the end of move i */
  toMove(i: number) {
    const n = this.cumulativeS.length;
    if (n === 0) return;
    const m = Math.min(n - 1, Math.max(0, i));
    this.set({ t: this.cumulativeS[m], move: m, line: this.lines[m], playing: false });
  }

  step(delta: number) {
    this.toMove(this.snap.move + delta);
  }

  /** the playhead to the first move at or after the line; the line itself stays the one shown */
  toLine(line: number) {
    if (this.cumulativeS.length === 0) return;
    const m = moveAtLine(this.lines, line);
    this.set({ t: this.cumulativeS[m], move: m, line, playing: false });
  }

  setSpeed(speed: number) {
    this.set({ speed });
  }

  play() {
    if (this.snap.playing) return;
    const start = this.snap.t >= this.totalS ? 0 : this.snap.t;
    this.set({ playing: true, t: start, move: moveAtTime(this.cumulativeS, start) });
    this.lastTick = performance.now();
    this.frameTimesMs = [];
    const tick = (now: number) => {
      if (!this.snap.playing) return;
      const dtMs = now - this.lastTick;
      this.frameTimesMs.push(dtMs);
      if (this.frameTimesMs.length > 2000) this.frameTimesMs.shift();
      this.lastTick = now;
      const t = Math.min(this.totalS, this.snap.t + (dtMs / 1000) * this.snap.speed);
      const move = moveAtTime(this.cumulativeS, t);
      const ended = t >= this.totalS;
      // panels re-render about 8 times a second; the scene every frame
      const emit = ended || now - this.lastEmit > 120;
      this.set({ t, move, line: this.lines[move] ?? 0, playing: !ended }, emit);
      if (!ended) this.frame = requestAnimationFrame(tick);
    };
    this.frame = requestAnimationFrame(tick);
  }

  pause() {
    cancelAnimationFrame(this.frame);
    if (this.snap.playing) this.set({ playing: false });
  }

  toggle() {
    if (this.snap.playing) this.pause();
    else this.play();
  }

  dispose() {
    cancelAnimationFrame(this.frame);
    this.listeners.clear();
    this.onChange = null;
  }
}

export function usePlayback(store: PlaybackStore): PlaybackSnapshot {
  return useSyncExternalStore(store.subscribe, store.getSnapshot, store.getSnapshot);
}
