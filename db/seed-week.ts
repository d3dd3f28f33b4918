// Demo jobs dated from the day the seed runs, so the dashboard (issue 15 point 5) has this
// week's work to show on a fresh `npm start`: sign letters for the bakery's window, scheduled
// on Router 1 and due this week (machine hours this week: the calibrated estimate per sheet ×
// the sheets the quantity needs), and the first cut of sign letter blanks on Router 2, due in
// two days, whose program still has an error finding (a rapid across the sheet at cutting
// depth: fixtures/programs/checks/rapid-through-stock.nc), so "programs due soon with errors"
// lists it. Both programs are committed fixtures stored the way an upload stores them, their
// estimates queued for the server to compute on start. Invented jobs of the demo shop.
// Idempotent: a job that exists keeps its rows; only a due date the calendar has passed by
// (a week or more ago, while the job still waits) is moved forward again by the same rule, so
// the demo stays current on a database seeded weeks ago.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { and, eq, inArray } from 'drizzle-orm';
import { jobEstimateSettings, requestEstimate } from '@/lib/estimate-server/request';
import { isoWeekDays } from '@/lib/reports/dashboard-figures';
import type { Tx } from './queries/machines';
import { storeSeedProgram } from './seed-program';
import { customers, jobs, machines, materials, programs, users } from './schema';
import type { JobStatus } from '@/lib/validation/enums';

interface WeekJob {
  title: string;
  customer: string;
  material: string;
  machine: string;
  fixture: string;
  zZero: 'top' | 'table';
  holdDown: 'vacuum' | 'tabs';
  vacuumKpa: number | null;
  quantity: number;
  status: JobStatus;
  /** the due date from the seed's day (UTC) */
  due: (today: Date) => string;
}

const day = (d: Date) => d.toISOString().slice(0, 10);
const addDays = (d: Date, n: number) => new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate() + n));

/** The Friday of the seed day's ISO week, or its Sunday once Friday has passed: always inside this week. */
export function dueThisWeek(today: Date): string {
  const { monday, sunday } = isoWeekDays(today);
  const friday = day(addDays(new Date(`${monday}T00:00:00Z`), 4));
  return day(today) <= friday ? friday : sunday;
}

export const WEEK_JOBS: WeekJob[] = [
  {
    title: 'Bakery window sign letters',
    customer: 'Marlow Street Bakery',
    material: 'Cast acrylic 3 mm',
    machine: 'Router 1',
    fixture: 'sign-letters-acrylic-3mm.gcode',
    zZero: 'top',
    holdDown: 'vacuum',
    vacuumKpa: 61,
    quantity: 40,
    status: 'scheduled',
    due: dueThisWeek,
  },
  {
    title: 'Sign letter blanks, first cut',
    customer: 'Marlow Street Bakery',
    material: 'HDPE 12 mm',
    machine: 'Router 2',
    fixture: 'checks/rapid-through-stock.nc',
    zZero: 'top',
    holdDown: 'tabs',
    vacuumKpa: null,
    quantity: 6,
    status: 'programmed',
    due: (today) => day(addDays(today, 2)),
  },
];

const fixturesDir = path.resolve(__dirname, '..', 'fixtures', 'programs');
const WAITING: JobStatus[] = ['draft', 'programmed', 'quoted', 'accepted', 'scheduled'];

/** Adds the dated demo jobs; returns how many jobs it inserted (0 when they were there). */
export async function seedWeekJobs(tx: Tx, shopId: number, today: Date = new Date()): Promise<number> {
  const [priya] = await tx.select({ id: users.id }).from(users).where(and(eq(users.shopId, shopId), eq(users.role, 'programmer')));
  let added = 0;
  for (const w of WEEK_JOBS) {
    const [customer] = await tx.select({ id: customers.id }).from(customers).where(and(eq(customers.shopId, shopId), eq(customers.name, w.customer)));
    const [material] = await tx.select().from(materials).where(and(eq(materials.shopId, shopId), eq(materials.name, w.material)));
    const [machine] = await tx.select({ id: machines.id }).from(machines).where(and(eq(machines.shopId, shopId), eq(machines.name, w.machine)));
    if (!customer || !material || !machine) continue;
    const dueDate = w.due(today);

    let [job] = await tx.select().from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.title, w.title)));
    if (!job) {
      const [{ id }] = await tx
        .insert(jobs)
        .values({
          shopId,
          title: w.title,
          customerId: customer.id,
          materialId: material.id,
          sheetWidthMm: material.sheetWidthMm,
          sheetLengthMm: material.sheetLengthMm,
          sheetThicknessMm: material.thicknessMm,
          zZero: w.zZero,
          holdDown: w.holdDown,
          vacuumKpa: w.vacuumKpa,
          quantity: w.quantity,
          status: w.status,
          dueDate,
          machineId: machine.id,
        })
        .$returningId();
      [job] = await tx.select().from(jobs).where(eq(jobs.id, id));
      added++;
    } else if (job.dueDate !== null && job.dueDate < day(addDays(new Date(`${isoWeekDays(today).monday}T00:00:00Z`), -7)) && WAITING.includes(job.status)) {
      await tx.update(jobs).set({ dueDate }).where(and(eq(jobs.id, job.id), inArray(jobs.status, WAITING)));
    }

    const name = path.basename(w.fixture);
    const [existing] = await tx.select({ id: programs.id }).from(programs).where(and(eq(programs.jobId, job.id), eq(programs.name, name)));
    if (existing) continue;
    const bytes = readFileSync(path.join(fixturesDir, w.fixture));
    const { programId, versionId, sha256 } = await storeSeedProgram(tx, { shopId, jobId: job.id, name, bytes, uploadedBy: priya?.id ?? null });
    await requestEstimate(tx, {
      shopId,
      programId,
      programVersionId: versionId,
      programVersion: 1,
      sha256,
      machineId: machine.id,
      requestedBy: priya?.id ?? null,
      settings: jobEstimateSettings(job),
    });
  }
  return added;
}
