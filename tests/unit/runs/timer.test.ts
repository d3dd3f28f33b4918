// The run timer's arithmetic (lib/runs/timer.ts) on timestamps chosen by hand.
import { describe, expect, it } from 'vitest';
import { pausedSeconds, runningSeconds, timerState, type TimerEvent } from '@/lib/runs/timer';

const t0 = Date.UTC(2026, 11, 4, 8, 0, 0);
const at = (s: number) => new Date(t0 + s * 1000);

describe('running time from server timestamps', () => {
  it('start 08:00:00, pause 08:12:30, resume 08:20:00, finish 08:47:15 → 12 min 30 s + 27 min 15 s = 2385 s', () => {
    const events: TimerEvent[] = [
      { kind: 'start', at: at(0) },
      { kind: 'pause', at: at(750) },
      { kind: 'resume', at: at(1200) },
      { kind: 'finish', at: at(2835) },
    ];
    expect(timerState(events)).toBe('finished');
    expect(runningSeconds(events)).toBe(2385);
    expect(pausedSeconds(events)).toBe(450);
  });

  it('a running timer counts to now; a paused one stands still', () => {
    const running: TimerEvent[] = [{ kind: 'start', at: at(0) }];
    expect(runningSeconds(running, at(90.5))).toBe(90.5);
    const paused: TimerEvent[] = [...running, { kind: 'pause', at: at(60) }];
    expect(timerState(paused)).toBe('paused');
    expect(runningSeconds(paused, at(600))).toBe(60);
    expect(runningSeconds(paused, at(6000))).toBe(60);
  });

  it('finishing while paused counts nothing after the pause', () => {
    const events: TimerEvent[] = [
      { kind: 'start', at: at(0) },
      { kind: 'pause', at: at(100) },
      { kind: 'finish', at: at(400) },
    ];
    expect(runningSeconds(events)).toBe(100);
  });

  it('refuses event lists the timer cannot make', () => {
    expect(() => timerState([])).toThrow(/begins with a start/);
    expect(() => timerState([{ kind: 'start', at: at(0) }, { kind: 'resume', at: at(1) }])).toThrow(/resume event cannot follow a running/);
    expect(() => timerState([{ kind: 'start', at: at(0) }, { kind: 'finish', at: at(1) }, { kind: 'pause', at: at(2) }])).toThrow();
    expect(() => timerState([{ kind: 'start', at: at(10) }, { kind: 'pause', at: at(5) }])).toThrow(/time order/);
  });
});
