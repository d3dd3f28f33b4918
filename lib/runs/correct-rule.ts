// Who may correct a finished run (issue 15): its own operator on the day it ended, an admin
// (runs:correct-any) any run on any day. "The day" is the UTC date, the clock the pages show
// (the shop has no time zone setting). Pure: db/queries/runs.ts decides with it and the runs
// list shows the correction form by it.
import { canDo } from '@/lib/auth/roles';
import type { Role } from '@/lib/validation/enums';

const utcDay = (d: Date | string) => (typeof d === 'string' ? new Date(d) : d).toISOString().slice(0, 10);

export function mayCorrect(
  user: { id: number; role: Role },
  run: { operatorId: number; startedAt: Date | string; finishedAt: Date | string | null },
  now: Date,
): boolean {
  if (canDo(user.role, 'runs:correct-any')) return true;
  if (!canDo(user.role, 'runs:write') || run.operatorId !== user.id) return false;
  return utcDay(run.finishedAt ?? run.startedAt) === utcDay(now);
}
