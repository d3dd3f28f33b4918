// The Runs section of a program page (server part): the machines a run can be started on,
// the first page of this version's runs as the server sees them now, and what the signed-in
// user may do. The timer and the forms are the client part (program-runs.tsx), which keeps
// the list fresh through GET /api/runs.
import { listMachines } from '@/db/queries/machines';
import { listRuns } from '@/db/queries/runs';
import { canDo } from '@/lib/auth/roles';
import type { SessionUser } from '@/lib/auth/session-user';
import { ProgramRuns } from './program-runs';

export async function ProgramRunsSection({ user, programId, version, jobMachineId }: { user: SessionUser; programId: number; version: number; jobMachineId: number | null }) {
  const [machines, first] = await Promise.all([listMachines(user.shopId), listRuns(user.shopId, { programId, version, page: 1, perPage: 25 })]);
  return (
    <ProgramRuns
      programId={programId}
      version={version}
      machines={machines.map((m) => ({ id: m.id, name: m.name }))}
      defaultMachineId={jobMachineId !== null && machines.some((m) => m.id === jobMachineId) ? jobMachineId : (machines[0]?.id ?? null)}
      initial={first}
      me={{ id: user.id, role: user.role, mayRun: canDo(user.role, 'runs:write'), mayCorrectAny: canDo(user.role, 'runs:correct-any') }}
    />
  );
}
