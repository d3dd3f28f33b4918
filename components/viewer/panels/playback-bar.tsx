'use client';
// Playback on the estimated clock: play/pause, one move back or forward, speed 1× to 500×, a
// scrubber over the planner's clock with the elapsed (aria-label "Elapsed", m:ss or h:mm:ss)
// and remaining time, jump to a line, and the tool's position in mm or inch.
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import type { Xyz } from '@/lib/gcode/move-list';
import type { LengthUnit } from '@/lib/units/length';
import { formatClock, formatCoordinate } from '@/lib/viewer/readouts';
import { PLAYBACK_SPEEDS, usePlayback, type PlaybackStore } from '../playback-store';

export function PlaybackBar({ store, lineCount, unit, onUnit, position }: { store: PlaybackStore; lineCount: number; unit: LengthUnit; onUnit: (u: LengthUnit) => void; position: Xyz | null }) {
  const snap = usePlayback(store);
  const total = store.totalS;
  const [lineText, setLineText] = useState('');
  const [lineError, setLineError] = useState<string | null>(null);
  const jump = (e: React.FormEvent) => {
    e.preventDefault();
    const n = Number(lineText);
    if (!Number.isInteger(n) || n < 1 || n > lineCount) {
      setLineError(`Give a line from 1 to ${lineCount.toLocaleString('en')}.`);
      return;
    }
    setLineError(null);
    store.toLine(n);
  };
  const sym = unit === 'mm' ? 'mm' : 'in';
  return (
    <section aria-label="Playback" className="flex flex-col gap-3 rounded-md border-2 border-night-line bg-night-raised p-3 text-white" data-testid="playback">
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" onClick={() => store.step(-1)} aria-label="One move back" title="One move back (←)">
          <span aria-hidden="true">◀︎ 1</span>
        </Button>
        <Button onClick={() => store.toggle()} aria-label={snap.playing ? 'Pause' : 'Play'} data-testid="play" className="min-w-28">
          {snap.playing ? 'Pause' : 'Play'}
        </Button>
        <Button variant="secondary" onClick={() => store.step(1)} aria-label="One move forward" title="One move forward (→)">
          <span aria-hidden="true">1 ▶︎</span>
        </Button>
        <label className="flex items-center gap-2 text-sm">
          Speed
          <select value={snap.speed} onChange={(e) => store.setSpeed(Number(e.target.value))} className="rounded border-2 border-night-edge bg-night px-2 py-1 text-white" data-testid="speed">
            {PLAYBACK_SPEEDS.map((s) => (
              <option key={s} value={s}>
                {s}×
              </option>
            ))}
          </select>
        </label>
        <p className="ml-auto flex items-baseline gap-3 text-sm">
          <span>
            Elapsed{' '}
            <span aria-label="Elapsed" className="figure text-lg font-bold" data-testid="elapsed">
              {formatClock(snap.t)}
            </span>
          </span>
          <span>
            Remaining <span className="figure text-lg font-bold">{formatClock(total - snap.t)}</span>
          </span>
        </p>
      </div>
      <label className="flex items-center gap-3 text-sm">
        <span className="shrink-0">Time</span>
        <input
          type="range"
          min={0}
          max={Math.max(total, 0.001)}
          step={Math.max(total / 2000, 0.001)}
          value={snap.t}
          onChange={(e) => store.seek(Number(e.target.value))}
          aria-valuetext={`${formatClock(snap.t)} of ${formatClock(total)}`}
          className="w-full accent-white"
          data-testid="scrubber"
        />
      </label>
      <div className="flex flex-wrap items-start gap-4 text-sm">
        <form onSubmit={jump} className="flex items-start gap-2" noValidate>
          <label className="flex items-center gap-2">
            Line
            <input
              inputMode="numeric"
              value={lineText}
              onChange={(e) => setLineText(e.target.value)}
              aria-invalid={lineError ? true : undefined}
              aria-describedby={lineError ? 'jump-line-error' : undefined}
              className="figure w-28 rounded border-2 border-night-edge bg-night px-2 py-1 text-white"
              data-testid="jump-line"
            />
          </label>
          <Button type="submit" variant="secondary">
            Go to line
          </Button>
          {lineError ? (
            <p id="jump-line-error" role="alert" className="self-center font-bold text-white">
              {lineError}
            </p>
          ) : null}
        </form>
        <p className="figure ml-auto self-center" data-testid="tool-readout">
          {position ? `X ${formatCoordinate(position.x, unit)}  Y ${formatCoordinate(position.y, unit)}  Z ${formatCoordinate(position.z, unit)} ${sym}` : ''}
        </p>
        <label className="flex items-center gap-2 self-center">
          Units
          <select value={unit} onChange={(e) => onUnit(e.target.value as LengthUnit)} className="rounded border-2 border-night-edge bg-night px-2 py-1 text-white" data-testid="unit">
            <option value="mm">mm</option>
            <option value="inch">inch</option>
          </select>
        </label>
      </div>
      <p className="text-xs text-night-edge">Keys on the view: space plays or pauses, ← → step one move, Home and End go to the start and the end.</p>
    </section>
  );
}
