// The dashboard's arithmetic, pure: this week's days (ISO 8601 weeks run Monday to Sunday,
// ISO 8601-1:2019 §3.1.2.23; the shop has no time zone setting, so the days are UTC like every
// page), the sheets a job needs, and the machine hours estimated for the week's jobs per machine.
//
// Machine hours of a job = Σ over its programs of the calibrated estimate of one sheet × the
// sheets the job needs, sheets = ⌈quantity ÷ parts per sheet⌉ (the quote's rule, lib/quotes/
// price.ts); a program whose estimate found no parts has no sheet count, so it is counted as
// one sheet and the panel says so.

const DAY_MS = 86_400_000;
const ymd = (d: Date) => d.toISOString().slice(0, 10);

/** The Monday and Sunday (YYYY-MM-DD, UTC) of the ISO week that holds `now`. */
export function isoWeekDays(now: Date): { monday: string; sunday: string } {
  const midnight = Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate());
  const sinceMonday = (new Date(midnight).getUTCDay() + 6) % 7;
  const monday = new Date(midnight - sinceMonday * DAY_MS);
  return { monday: ymd(monday), sunday: ymd(new Date(monday.getTime() + 6 * DAY_MS)) };
}

/** Today and the day `days` later (YYYY-MM-DD, UTC), both included: "due in the next days". */
export function nextDays(now: Date, days: number): { from: string; to: string } {
  const midnight = Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate());
  return { from: ymd(new Date(midnight)), to: ymd(new Date(midnight + days * DAY_MS)) };
}

/** ⌈quantity ÷ parts per sheet⌉; null when the estimate found no parts (the sheets are unknown). */
export function sheetsNeeded(quantity: number, partsPerSheet: number | null): number | null {
  if (!partsPerSheet || partsPerSheet < 1 || !Number.isInteger(partsPerSheet)) return null;
  return Math.ceil(quantity / partsPerSheet);
}

/** One program of a job planned this week, with the estimate of its latest version on the job's machine. */
export interface WeekProgram {
  jobId: number;
  machineId: number;
  machineName: string;
  quantity: number;
  /** calibrated seconds of one sheet; null: no finished estimate yet */
  secondsPerSheet: number | null;
  partsPerSheet: number | null;
}

export interface MachineWeek {
  machineId: number;
  machineName: string;
  hours: number;
  jobs: number;
  /** programs of these jobs without a finished estimate: not in the hours */
  programsWithoutEstimate: number;
  /** programs whose estimate found no parts: counted as one sheet */
  programsWithoutParts: number;
}

export function hoursByMachine(programs: readonly WeekProgram[]): MachineWeek[] {
  const out = new Map<number, MachineWeek & { jobIds: Set<number> }>();
  for (const p of programs) {
    const m = out.get(p.machineId) ?? { machineId: p.machineId, machineName: p.machineName, hours: 0, jobs: 0, programsWithoutEstimate: 0, programsWithoutParts: 0, jobIds: new Set<number>() };
    m.jobIds.add(p.jobId);
    if (p.secondsPerSheet === null) m.programsWithoutEstimate++;
    else {
      const sheets = sheetsNeeded(p.quantity, p.partsPerSheet);
      if (sheets === null) m.programsWithoutParts++;
      m.hours += (p.secondsPerSheet * (sheets ?? 1)) / 3600;
    }
    out.set(p.machineId, m);
  }
  return [...out.values()]
    .map(({ jobIds, ...m }) => ({ ...m, jobs: jobIds.size }))
    .sort((a, b) => a.machineName.localeCompare(b.machineName) || a.machineId - b.machineId);
}
