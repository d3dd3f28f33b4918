// Demo data for `npm start` and the tests: the Alder & Finch shop, one user per role,
// two machines with tools and a version snapshot, materials, customers and jobs.
// Idempotent: rows are found by their natural keys and inserted only when missing;
// existing rows (a changed role, an edited machine) are left as they are.
// The demo users share a published password, so the seed runs only in local mode
// (lib/env.ts: APP_URL on loopback, not a production server unless KERFCAST_LOCAL=1) and
// against a database on loopback; anywhere else it refuses (issue 18 finding 10, OWASP
// ASVS 4.0.3 V2.10.1, V14.1).
import path from 'node:path';
import bcrypt from 'bcryptjs';
import { and, eq, isNull, sql } from 'drizzle-orm';
import { env, isLoopbackHost, type Env } from '@/lib/env';
import { db as defaultDb, closeDb, type Db } from './client';
import { customers, jobs, machineVersions, machines, materials, shops, tools, users } from './schema';
import { BCRYPT_COST, DEMO_PASSWORD, demoCustomers, demoJobs, demoMachines, demoMaterials, demoShop, demoUsers } from './seed-data';
import { machineRowToProfile, profileToMachineColumns } from './queries/machines';
import { readProfileFile } from './seed-machines';
import { seedRuns } from './seed-runs';
import { seedHoldDownDemo } from './seed-holddown';
import { seedWeekJobs } from './seed-week';

const fixturesDir = path.resolve(__dirname, '..', 'fixtures', 'machines');
// A no-op update: "insert unless the unique key exists" without INSERT IGNORE's habit
// of turning every other error into a warning.
const keep = { set: { id: sql`id` } };

export interface SeedSummary {
  shopId: number;
  logins: { email: string; role: string; password: string }[];
}

/** Why the demo seed may not run with these settings, or null when it may. */
export function seedRefusal(settings: Pick<Env, 'isLocal' | 'DATABASE_URL' | 'APP_URL'> = env): string | null {
  if (!settings.isLocal) return `not in local mode (APP_URL ${settings.APP_URL}; a production server needs KERFCAST_LOCAL=1 and a loopback APP_URL)`;
  let host = '';
  try {
    host = new URL(settings.DATABASE_URL).hostname;
  } catch {
    host = '';
  }
  if (!isLoopbackHost(host)) return `the database (${host || 'unknown host'}) is not on this machine's loopback address`;
  return null;
}

export async function seed(db: Db = defaultDb): Promise<SeedSummary> {
  const refusal = seedRefusal();
  if (refusal) throw new Error(`the demo seed creates users with a published password and runs only on a local install: ${refusal}`);
  const profiles = demoMachines.map((m) => ({ ...m, profile: readProfileFile(path.join(fixturesDir, m.fixture)) }));
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, BCRYPT_COST);

  return db.transaction(async (tx) => {
    await tx.insert(shops).values(demoShop).onDuplicateKeyUpdate(keep);
    const [shop] = await tx.select({ id: shops.id }).from(shops).where(eq(shops.slug, demoShop.slug));
    const shopId = shop.id;

    for (const u of demoUsers) {
      await tx.insert(users).values({ ...u, shopId, passwordHash }).onDuplicateKeyUpdate(keep);
    }

    for (const m of profiles) {
      await tx
        .insert(machines)
        .values({ ...profileToMachineColumns(m.profile), shopId, hourlyRateMinor: m.hourlyRateMinor, defaultHoldDown: m.defaultHoldDown, defaultVacuumKpa: m.defaultVacuumKpa })
        // an existing demo machine keeps its edits; a vacuum level it never had (the column
        // came with migration 0004) is filled in
        .onDuplicateKeyUpdate({ set: { defaultVacuumKpa: sql`COALESCE(${machines.defaultVacuumKpa}, VALUES(${machines.defaultVacuumKpa}))` } });
      const [row] = await tx.select().from(machines).where(and(eq(machines.shopId, shopId), eq(machines.name, m.profile.name)));
      for (const t of m.profile.tools) {
        await tx
          .insert(tools)
          .values({
            shopId,
            machineId: row.id,
            number: t.number,
            diameterMm: t.diameterMm,
            flutes: t.flutes,
            kind: t.kind,
            description: m.toolDescriptions[t.number] ?? '',
          })
          .onDuplicateKeyUpdate(keep);
      }
      // The snapshot of the machine's current version, as the estimator reads it.
      const machineTools = await tx.select().from(tools).where(eq(tools.machineId, row.id));
      await tx
        .insert(machineVersions)
        .values({ shopId, machineId: row.id, version: row.version, profile: machineRowToProfile(row, machineTools) })
        .onDuplicateKeyUpdate(keep);
    }

    for (const m of demoMaterials) {
      await tx.insert(materials).values({ ...m, shopId }).onDuplicateKeyUpdate(keep);
    }
    for (const c of demoCustomers) {
      // Customer names may repeat within a shop (two branches), so look before inserting.
      const found = await tx
        .select({ id: customers.id })
        .from(customers)
        .where(and(eq(customers.shopId, shopId), eq(customers.name, c.name)));
      if (found.length === 0) await tx.insert(customers).values({ ...c, shopId });
    }

    const customerIds = new Map(
      (await tx.select({ id: customers.id, name: customers.name }).from(customers).where(eq(customers.shopId, shopId))).map(
        (c) => [c.name, c.id],
      ),
    );
    const materialRows = await tx.select().from(materials).where(eq(materials.shopId, shopId));
    const machineIds = new Map(
      (await tx.select({ id: machines.id, name: machines.name }).from(machines).where(eq(machines.shopId, shopId))).map((m) => [m.name, m.id]),
    );
    for (const j of demoJobs) {
      const machineId = machineIds.get(j.machine);
      if (machineId === undefined) throw new Error(`seed: job "${j.title}" names a missing machine`);
      // Jobs have no natural unique key (titles may repeat), so look before inserting.
      const existing = await tx
        .select({ id: jobs.id })
        .from(jobs)
        .where(and(eq(jobs.shopId, shopId), eq(jobs.title, j.title)));
      if (existing.length > 0) {
        // a demo job seeded before jobs named their machine gets its machine, nothing else changes
        await tx.update(jobs).set({ machineId, updatedAt: sql`${jobs.updatedAt}` }).where(and(eq(jobs.shopId, shopId), eq(jobs.title, j.title), isNull(jobs.machineId)));
        continue;
      }
      const material = materialRows.find((m) => m.name === j.material);
      const customerId = customerIds.get(j.customer);
      if (!material || customerId === undefined) throw new Error(`seed: job "${j.title}" names a missing customer or material`);
      await tx.insert(jobs).values({
        shopId,
        title: j.title,
        customerId,
        materialId: material.id,
        sheetWidthMm: material.sheetWidthMm,
        sheetLengthMm: material.sheetLengthMm,
        sheetThicknessMm: material.thicknessMm,
        zZero: j.zZero,
        holdDown: j.holdDown,
        vacuumKpa: j.vacuumKpa,
        quantity: j.quantity,
        status: j.status,
        machineId,
      });
    }

    await seedRuns(tx, shopId);
    await seedHoldDownDemo(tx, shopId);
    await seedWeekJobs(tx, shopId);
    return { shopId, logins: demoUsers.map((u) => ({ email: u.email, role: u.role, password: DEMO_PASSWORD })) };
  });
}

export function printLogins(summary: SeedSummary): void {
  console.log(`Demo sign-ins for ${demoShop.name} (password for all: ${DEMO_PASSWORD}):`);
  for (const l of summary.logins) console.log(`  ${l.role.padEnd(10)} ${l.email}`);
}

if (require.main === module) {
  seed()
    .then((summary) => {
      console.log('seed: demo data in place');
      printLogins(summary);
    })
    .catch((err: unknown) => {
      console.error(`seed: failed: ${err instanceof Error ? err.message : String(err)}`);
      process.exitCode = 1;
    })
    .finally(() => closeDb());
}
