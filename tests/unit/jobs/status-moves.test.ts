// The job status steps against issue 12's order ("draft → programmed → quoted → accepted →
// scheduled → running → done (and cancelled)") and the brief's owners of each step (PRODUCT.md,
// "The main job, end to end": 2–3 programmer, 6 estimator, 7 operator; see the header of
// tests/unit/auth/roles.test.ts for the inferred ones). The expectations are written out here as
// a walk through the order, not read from the module's table.
import { describe, expect, it } from 'vitest';
import { checkStatusMove, isEditable, movesFor, nextStatuses } from '@/lib/jobs/status-moves';
import { JOB_STATUSES, type JobStatus, type Role } from '@/lib/validation/enums';

const ORDER: JobStatus[] = ['draft', 'programmed', 'quoted', 'accepted', 'scheduled', 'running', 'done'];
// who owns the step into each status (brief, main job steps 2–7)
const OWNER: Record<Exclude<JobStatus, 'draft' | 'cancelled'>, Role> = {
  programmed: 'programmer',
  quoted: 'estimator',
  accepted: 'estimator',
  scheduled: 'estimator',
  running: 'operator',
  done: 'operator',
};
const withProgram = { programCount: 1 };

describe('the order of steps', () => {
  it('walks draft to done one step at a time, each by its owner', () => {
    for (let i = 0; i + 1 < ORDER.length; i++) {
      const to = ORDER[i + 1] as keyof typeof OWNER;
      expect(checkStatusMove(OWNER[to], ORDER[i], to, withProgram), `${ORDER[i]} → ${to}`).toMatchObject({ ok: true });
    }
  });

  it('skips no step and goes back to none (the admin, who may take every step, included)', () => {
    for (const from of JOB_STATUSES) {
      for (const to of ORDER.slice(1)) {
        const i = ORDER.indexOf(from);
        const isNext = i >= 0 && ORDER[i + 1] === to;
        expect(checkStatusMove('admin', from, to, withProgram).ok, `${from} → ${to}`).toBe(isNext);
      }
    }
    expect(checkStatusMove('admin', 'programmed', 'draft', withProgram)).toMatchObject({ ok: false, reason: 'no-step' });
  });

  it('cancels any job before its run, and neither a running, a done nor a cancelled one', () => {
    for (const from of JOB_STATUSES) {
      const expected = ['draft', 'programmed', 'quoted', 'accepted', 'scheduled'].includes(from);
      expect(checkStatusMove('admin', from, 'cancelled', withProgram).ok, from).toBe(expected);
    }
  });

  it('lists the next statuses of each status', () => {
    expect(nextStatuses('draft')).toEqual(['programmed', 'cancelled']);
    expect(nextStatuses('scheduled')).toEqual(['running', 'cancelled']);
    expect(nextStatuses('running')).toEqual(['done']);
    expect(nextStatuses('done')).toEqual([]);
    expect(nextStatuses('cancelled')).toEqual([]);
  });
});

describe('who takes each step', () => {
  it('refuses a step to a role that does not own it, saying who may (403 before 409)', () => {
    const check = checkStatusMove('operator', 'programmed', 'quoted', withProgram);
    expect(check).toEqual({ ok: false, reason: 'forbidden', message: 'An admin or an estimator can move a job to quoted.' });
    // the role is checked first: the operator never marks a job quoted, whatever its status
    expect(checkStatusMove('operator', 'draft', 'quoted', withProgram)).toMatchObject({ reason: 'forbidden' });
    expect(checkStatusMove('programmer', 'scheduled', 'running', withProgram)).toMatchObject({ reason: 'forbidden' });
    expect(checkStatusMove('operator', 'draft', 'cancelled', withProgram)).toMatchObject({ reason: 'forbidden' });
  });

  it('names the next step when the role may take the step but the job is not there yet', () => {
    expect(checkStatusMove('operator', 'programmed', 'running', withProgram)).toEqual({
      ok: false,
      reason: 'no-step',
      message: 'This job is programmed, so it cannot be moved to running: its next step is quoted or cancelled.',
    });
  });

  it('marks a job programmed only once it has a program', () => {
    expect(checkStatusMove('programmer', 'draft', 'programmed', { programCount: 0 })).toMatchObject({ ok: false, reason: 'needs-program' });
    expect(checkStatusMove('programmer', 'draft', 'programmed', withProgram).ok).toBe(true);
  });

  it('offers each role its own buttons', () => {
    const verbs = (role: Role, from: JobStatus, programCount = 1) => movesFor(role, from, { programCount }).map((m) => m.to);
    expect(verbs('programmer', 'draft')).toEqual(['programmed', 'cancelled']);
    expect(verbs('programmer', 'draft', 0)).toEqual(['cancelled']);
    expect(verbs('estimator', 'programmed')).toEqual(['quoted', 'cancelled']);
    expect(verbs('operator', 'programmed')).toEqual([]);
    expect(verbs('operator', 'scheduled')).toEqual(['running']);
    expect(verbs('operator', 'running')).toEqual(['done']);
    expect(verbs('admin', 'done')).toEqual([]);
  });
});

describe('editing', () => {
  it('keeps a done or cancelled job as it was', () => {
    expect(JOB_STATUSES.filter((s) => !isEditable(s))).toEqual(['done', 'cancelled']);
  });
});
