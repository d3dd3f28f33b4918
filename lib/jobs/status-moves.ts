// The job status steps, in one pure table: draft → programmed → quoted → accepted →
// scheduled → running → done, and cancelled from any step before the run. Each step names
// the action in lib/auth/roles.ts that a role needs to take it, so who may move a job is
// still read from the one role table. Used by PATCH /api/jobs/[jobId] (the check) and the
// job page (which buttons to offer). No database, no React: tests/unit/jobs/status-moves.test.ts.
import { canDo, type Action } from '@/lib/auth/roles';
import { JOB_STATUS_LABELS, type JobStatus, type Role } from '@/lib/validation/enums';
import { whoMay } from '@/lib/auth/messages';

export interface StatusMove {
  from: readonly JobStatus[];
  to: JobStatus;
  action: Action;
  /** the button's words on the job page */
  verb: string;
  /** the step needs at least one uploaded program */
  needsProgram?: boolean;
}

const BEFORE_THE_RUN = ['draft', 'programmed', 'quoted', 'accepted', 'scheduled'] as const satisfies readonly JobStatus[];

/** Every step a job can take; one entry per target status. */
export const STATUS_MOVES: readonly StatusMove[] = [
  // the upload does this on its own; the button is for a program that came in another way
  { from: ['draft'], to: 'programmed', action: 'jobs:mark-programmed', verb: 'Mark as programmed', needsProgram: true },
  { from: ['programmed'], to: 'quoted', action: 'jobs:mark-quoted', verb: 'Mark as quoted' },
  { from: ['quoted'], to: 'accepted', action: 'jobs:mark-accepted', verb: 'Mark as accepted' },
  { from: ['accepted'], to: 'scheduled', action: 'jobs:schedule', verb: 'Schedule' },
  { from: ['scheduled'], to: 'running', action: 'jobs:start-run', verb: 'Start the run' },
  { from: ['running'], to: 'done', action: 'jobs:finish-run', verb: 'Finish the run' },
  // a job already on the machine is finished first, then its history says what happened
  { from: BEFORE_THE_RUN, to: 'cancelled', action: 'jobs:cancel', verb: 'Cancel the job' },
];

export interface MoveContext {
  /** programs uploaded to the job */
  programCount: number;
}

export type MoveCheck =
  | { ok: true; move: StatusMove }
  | { ok: false; reason: 'forbidden' | 'no-step' | 'needs-program'; message: string };

const word = (status: JobStatus) => JOB_STATUS_LABELS[status].toLowerCase();

export function moveTo(to: JobStatus): StatusMove | undefined {
  return STATUS_MOVES.find((m) => m.to === to);
}

/** The statuses a job in `from` can move to next, whoever takes the step. */
export function nextStatuses(from: JobStatus): JobStatus[] {
  return STATUS_MOVES.filter((m) => m.from.includes(from)).map((m) => m.to);
}

/**
 * May this role move a job from `from` to `to` now? The role is checked first: a role that
 * may never take a step to `to` hears that (403), whatever the job's status; then the step
 * itself (409).
 */
export function checkStatusMove(role: Role, from: JobStatus, to: JobStatus, context: MoveContext): MoveCheck {
  const move = moveTo(to);
  if (!move) return { ok: false, reason: 'no-step', message: `A job cannot be moved back to ${word(to)}.` };
  if (!canDo(role, move.action)) {
    return { ok: false, reason: 'forbidden', message: `${whoMay(move.action, true)} can move a job to ${word(to)}.` };
  }
  if (!move.from.includes(from)) {
    const next = nextStatuses(from).map(word);
    const options = next.length === 0 ? 'it has no further step' : `its next step is ${next.join(' or ')}`;
    return { ok: false, reason: 'no-step', message: `This job is ${word(from)}, so it cannot be moved to ${word(to)}: ${options}.` };
  }
  if (move.needsProgram && context.programCount < 1) {
    return { ok: false, reason: 'needs-program', message: 'Upload a program first: a job is programmed once it has one.' };
  }
  return { ok: true, move };
}

/** The steps this role can take on a job in `from` now: the buttons of the job page. */
export function movesFor(role: Role, from: JobStatus, context: MoveContext): StatusMove[] {
  return STATUS_MOVES.filter((m) => checkStatusMove(role, from, m.to, context).ok);
}

/** Jobs stay editable until they are done or cancelled; after that the record is kept as it was. */
export function isEditable(status: JobStatus): boolean {
  return status !== 'done' && status !== 'cancelled';
}
