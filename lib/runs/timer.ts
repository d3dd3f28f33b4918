// The run timer from the server's timestamps. A run's events are start, then any number of
// pause/resume pairs, then finish; the running time is the sum of the spans from start or
// resume to the next pause or finish (or to `now` while the timer still runs). Pure: the
// same arithmetic serves the server (finish writes actualSeconds from the stored events)
// and the browser (the ticking display), so a reload or a second device shows the same time.
import type { RunEventKind } from '@/lib/validation/enums';

export interface TimerEvent {
  kind: RunEventKind;
  at: Date | string | number;
}

export type TimerState = 'running' | 'paused' | 'finished';

const ms = (at: TimerEvent['at']) => (at instanceof Date ? at.getTime() : typeof at === 'string' ? Date.parse(at) : at);

/** Which moves the timer allows next from a state (the server refuses the rest with 409). */
export const NEXT_EVENTS: Record<TimerState, readonly RunEventKind[]> = {
  running: ['pause', 'finish'],
  paused: ['resume', 'finish'],
  finished: [],
};

/** The state after a well-formed list of events; throws on a list the timer could not have made. */
export function timerState(events: readonly TimerEvent[]): TimerState {
  if (events.length === 0 || events[0].kind !== 'start') throw new Error('a run timer begins with a start event');
  let state: TimerState = 'running';
  let last = ms(events[0].at);
  for (const e of events.slice(1)) {
    if (!NEXT_EVENTS[state].includes(e.kind)) throw new Error(`a ${e.kind} event cannot follow a ${state} timer`);
    const at = ms(e.at);
    if (at < last) throw new Error('run events are out of time order');
    last = at;
    state = e.kind === 'pause' ? 'paused' : e.kind === 'finish' ? 'finished' : 'running';
  }
  return state;
}

/** Seconds the timer ran, from the events; a running timer counts up to `now`. */
export function runningSeconds(events: readonly TimerEvent[], now: Date | number = Date.now()): number {
  timerState(events);
  let total = 0;
  let since: number | null = null;
  for (const e of events) {
    const at = ms(e.at);
    if (e.kind === 'start' || e.kind === 'resume') since = at;
    else if (since !== null) {
      total += at - since;
      since = null;
    }
  }
  if (since !== null) total += Math.max(0, ms(now) - since);
  return total / 1000;
}

/** Seconds paused in all, for the run's page. */
export function pausedSeconds(events: readonly TimerEvent[], now: Date | number = Date.now()): number {
  if (events.length === 0) return 0;
  const end = events.at(-1)!.kind === 'finish' ? ms(events.at(-1)!.at) : ms(now);
  return Math.max(0, (end - ms(events[0].at)) / 1000 - runningSeconds(events, now));
}
