// A job_events row as a line of the job's history. The kinds are written by db/queries/jobs.ts
// (created, edited, status), db/queries/programs.ts (program-uploaded) and the estimate queue
// (estimate-done); a kind this page does not know yet still shows its detail or its name.
import { JOB_STATUS_LABELS, JOB_STATUSES, type JobStatus } from '@/lib/validation/enums';

const isStatus = (s: string): s is JobStatus => (JOB_STATUSES as readonly string[]).includes(s);

export function historyLine(kind: string, detail: string): string {
  switch (kind) {
    case 'created':
      return 'Created the job.';
    case 'edited':
      return detail ? `Changed ${detail}.` : 'Edited the job.';
    case 'status': {
      const [from, to] = detail.split('>');
      if (from && to && isStatus(from) && isStatus(to)) return `Moved the job from ${JOB_STATUS_LABELS[from].toLowerCase()} to ${JOB_STATUS_LABELS[to].toLowerCase()}.`;
      return `Changed the status (${detail}).`;
    }
    case 'program-uploaded':
      return `Uploaded ${detail}.`;
    case 'estimate-done':
      // lib/estimate-server/queue.ts writes a sentence: "Estimate 16 of brackets.nc v1: 271.0 s, …"
      return detail ? `finished ${detail.charAt(0).toLowerCase()}${detail.slice(1)}` : 'finished an estimate.';
    default:
      return detail || `${kind.replace(/-/g, ' ')}.`;
  }
}
