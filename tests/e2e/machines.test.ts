// Browser test of the machine pages: the admin (machine set-up is the admin's, PRODUCT.md
// "The main job" step 1) edits a machine's corner tolerance from
// the keyboard and sees version 2 with the change named; a bad value is named at its
// field and focused; the programmer and the operator read the pages without a control that
// changes them; once the admin switches the shop to inches, the pages and forms show
// inches, an untouched save makes no version, and a tool typed as 1/4 in is stored as
// 6.35 mm (25.4 mm per inch, NIST SP 811). Screenshots go to KERFCAST_SHOTS (if set).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import path from 'node:path';
import fs from 'node:fs';
import { eq, like } from 'drizzle-orm';
import type { Page } from 'playwright-core';
import { E2E_PORT, startAppServer, type AppServer } from '../integration/support/app-server';
import { MachineEditPage, MachinePage, MachinesListPage, MaterialsPage, ToolFormPage } from './pages/machines-page';
import { signInAs } from './pages/sign-in-page';
import { launchBrowser, type BrowserSession } from './support/browser';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

const NAME = 'Test M Router E2E';
const SHOTS = process.env.KERFCAST_SHOTS;

let server: AppServer;
let browser: BrowserSession;
let dbm: DbModule;
let s: Schema;
let machineId = 0;

async function shot(page: Page, name: string) {
  if (!SHOTS) return;
  fs.mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

async function cleanUp() {
  await dbm.db.delete(s.jobs).where(like(s.jobs.title, 'Test M %'));
  const ours = await dbm.db.select({ id: s.machines.id }).from(s.machines).where(like(s.machines.name, 'Test M Router E2E%'));
  for (const { id } of ours) {
    await dbm.db.delete(s.tools).where(eq(s.tools.machineId, id));
    await dbm.db.delete(s.machineVersions).where(eq(s.machineVersions.machineId, id));
    await dbm.db.delete(s.machines).where(eq(s.machines.id, id));
  }
  await dbm.db.delete(s.materials).where(like(s.materials.name, 'Test M %'));
  await dbm.db.update(s.shops).set({ lengthUnit: 'mm' }).where(eq(s.shops.slug, 'alder-finch'));
}

beforeAll(async () => {
  server = await startAppServer(E2E_PORT);
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  await cleanUp();
  const { readProfileFile } = await import('@/db/seed-machines');
  const { profileToMachineColumns, machineRowToProfile } = await import('@/db/queries/machines');
  const profile = { ...readProfileFile(path.resolve(__dirname, '../../fixtures/machines/router-1.json')), name: NAME, tools: [] };
  const [shop] = await dbm.db.select().from(s.shops).where(eq(s.shops.slug, 'alder-finch'));
  [{ id: machineId }] = await dbm.db.insert(s.machines).values({ ...profileToMachineColumns(profile), shopId: shop.id, hourlyRateMinor: 9000 }).$returningId();
  const [row] = await dbm.db.select().from(s.machines).where(eq(s.machines.id, machineId));
  await dbm.db.insert(s.machineVersions).values({ shopId: shop.id, machineId, version: 1, profile: machineRowToProfile(row, []) });
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  if (dbm) {
    await cleanUp();
    await dbm.closeDb();
  }
  await server?.stop();
});

const signedInPage = (email: string) => signInAs(browser, server.baseUrl, email);

describe('machine profile (admin)', () => {
  it('names a bad value at its field and focuses it, then saves 0.03 mm as version 2', async () => {
    const page = await signedInPage('ada@alder-finch.example');
    const machine = new MachinePage(page, server.baseUrl);
    await machine.open(machineId);
    expect(await machine.versionLead()).toMatch(/^Profile version 1\b/);
    expect(await machine.profileField('cornerToleranceMm')).toEqual({ label: 'Corner tolerance (mm)', value: '0.02' });
    await shot(page, 'machine-page-mm');

    await machine.editProfile();
    const edit = new MachineEditPage(page, server.baseUrl);
    expect(await edit.value('Corner tolerance (mm)')).toBe('0.02');
    await edit.typeAndEnter('Corner tolerance (mm)', '-1');
    expect(await edit.fieldError('Corner tolerance (mm)')).toBe('Corner tolerance must be 0 or more.');
    expect(await edit.focusedLabel()).toBe('Corner tolerance (mm)');
    await shot(page, 'machine-edit-error');

    await edit.typeAndEnter('Corner tolerance (mm)', '0.03');
    await page.waitForURL(new RegExp(`/machines/${machineId}\\?saved=version&v=2$`));
    expect(await machine.statusMessage()).toBe('Saved as version 2.');
    expect(await machine.versionLead()).toMatch(/^Profile version 2\b/);
    expect(await machine.versionNumbers()).toEqual(['v2', 'v1']);
    expect(await machine.changesOf(2)).toEqual(['Corner tolerance 0.02 → 0.03 mm']);
    await shot(page, 'machine-page-v2');
    await page.close();
  });
});

describe('inch display (admin sets it)', () => {
  it('shows inches everywhere, keeps the version on an untouched save, and stores 1/4 in as 6.35 mm', async () => {
    const admin = await signedInPage('ada@alder-finch.example');
    const list = new MachinesListPage(admin, server.baseUrl);
    await list.open();
    expect(await list.setLengthUnit('Inches (in)')).toBe('Lengths are now shown in inches (in). Stored values stay in mm.');
    await admin.reload();
    expect(await list.travelHeader()).toBe('Travel X × Y × Z (in)');
    await shot(admin, 'machines-list-inch');
    await admin.close();

    const page = await signedInPage('ada@alder-finch.example');
    const machine = new MachinePage(page, server.baseUrl);
    await machine.open(machineId);
    // 0.03 mm ÷ 25.4 = 0.001181… in; 3060 mm ÷ 25.4 = 120.4724… in
    expect(await machine.profileField('cornerToleranceMm')).toEqual({ label: 'Corner tolerance (in)', value: '0.00118' });
    expect((await machine.profileField('travelMm')).value).toBe('120.4724 × 60.2362 × 7.0866');

    await machine.editProfile();
    const edit = new MachineEditPage(page, server.baseUrl);
    expect(await edit.value('Corner tolerance (in)')).toBe('0.00118');
    expect(await edit.value('Travel X')).toBe('120.4724');
    await shot(page, 'machine-edit-inch');
    await edit.save();
    await page.waitForURL(new RegExp(`/machines/${machineId}\\?saved=same&v=2$`));
    expect(await machine.statusMessage()).toBe('Saved. No profile field changed, so the profile stays version 2.');
    expect(await machine.versionLead()).toMatch(/^Profile version 2\b/);

    const tools = new ToolFormPage(page, server.baseUrl);
    await tools.add({ number: '3', diameter: '1/4', diameterLabel: 'Diameter (in)', flutes: '2', kind: 'Compression spiral' });
    expect(await tools.status()).toBe('Tool 3 added; the profile is now version 3.');
    const [tool] = await dbm.db.select().from(s.tools).where(eq(s.tools.machineId, machineId));
    expect(tool.diameterMm).toBe(6.35);
    await page.getByRole('table', { name: `Tools of ${NAME}` }).waitFor();
    expect(await page.getByRole('table', { name: `Tools of ${NAME}` }).locator('tbody td').nth(1).innerText()).toBe('0.25');
    await shot(page, 'machine-page-inch-tools');

    // a new description alone is not a profile change
    await page.getByRole('link', { name: 'Edit tool 3' }).click();
    await page.waitForURL(/\/tools\/\d+$/);
    const toolForm = page.getByRole('form', { name: 'Tool 3' });
    expect(await toolForm.getByLabel('Diameter (in)').inputValue()).toBe('0.25');
    await toolForm.getByLabel('Description').fill('1/4 in compression, sign faces');
    await shot(page, 'tool-edit-inch');
    await toolForm.getByLabel('Description').press('Enter');
    await page.waitForURL(new RegExp(`/machines/${machineId}\\?saved=tool-same&v=3$`));
    expect(await machine.statusMessage()).toBe('Tool saved. Only the description changed, so the profile stays version 3.');
    await page.close();
  });
});

describe('new machine (admin)', () => {
  it('adds a machine from the form, every field typed, as version 1', async () => {
    const p = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../fixtures/machines/router-2.json'), 'utf8'));
    const page = await signedInPage('ada@alder-finch.example');
    await page.goto(`${server.baseUrl}/machines/new`);
    const form = new MachineEditPage(page, server.baseUrl, 'New machine');
    await form.submit('Add machine');
    expect(await form.fieldError('Name')).toBe('Name is required.');
    expect(await form.fieldError('Travel X')).toBe('Travel X is required.');
    await shot(page, 'machine-new-errors');
    // the shop is in inches from the test above: type inches, as its admin would
    const axes: [string, string, number][] = [
      ['Travel', 'travelMm', 1 / 25.4], ['Fastest cutting feed', 'maxFeedMmPerMin', 1 / 25.4], ['Rapid speed', 'rapidMmPerMin', 1 / 25.4], ['Acceleration', 'accelMmPerS2', 1 / 25.4],
    ];
    await form.fill('Name', `${NAME} new`);
    await form.fill('Hourly rate (EUR per hour)', '70');
    await form.choose('Default hold-down', 'Screws or clamps');
    for (const [subject, key, f] of axes) for (const a of ['x', 'y', 'z']) await form.fill(`${subject} ${a.toUpperCase()}`, String(p[key][a] * f));
    await form.fill('Corner tolerance (in)', String(p.cornerToleranceMm / 25.4));
    await form.fill('Look-ahead (blocks; 0 = unlimited)', String(p.lookaheadBlocks));
    await form.fill('Block rate limit (blocks per second; 0 = none)', String(p.maxBlocksPerS));
    await form.fill('Arc chord tolerance (in)', String(p.chordToleranceMm / 25.4));
    await form.fill('Tool change time (s)', String(p.toolChangeSeconds));
    await form.fill('Spindle spin-up time (s)', String(p.spindleSpinUpSeconds));
    await form.submit('Add machine');
    await page.waitForURL(/\/machines\/\d+\?saved=created&v=1$/);
    const machine = new MachinePage(page, server.baseUrl);
    expect(await machine.statusMessage()).toBe(`${NAME} new added as version 1. Add its tools below.`);
    const [row] = await dbm.db.select().from(s.machines).where(eq(s.machines.name, `${NAME} new`));
    // typed as inches, stored as mm (×25.4, rounded to 12 significant digits)
    expect(row).toMatchObject({ travelXMm: 2500, travelYMm: 1250, travelZMm: 150, maxFeedXMmPerMin: 20000, cornerToleranceMm: 0.015, chordToleranceMm: 0.005, hourlyRateMinor: 7000, defaultHoldDown: 'clamps', version: 1 });
    await page.close();
  });
});

describe('remove or archive (admin)', () => {
  it('archives a machine a job names, keeps it readable and restorable; deletes one nothing names', async () => {
    const [machineRow] = await dbm.db.select().from(s.machines).where(eq(s.machines.name, `${NAME} new`));
    const [customer] = await dbm.db.select().from(s.customers).where(eq(s.customers.shopId, machineRow.shopId)).limit(1);
    await dbm.db.insert(s.jobs).values({
      shopId: machineRow.shopId, title: 'Test M job on the new router', customerId: customer.id, machineId: machineRow.id,
      sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 12, holdDown: 'clamps', quantity: 1,
    });
    const page = await signedInPage('ada@alder-finch.example');
    const machine = new MachinePage(page, server.baseUrl);
    await machine.open(machineRow.id);
    await page.getByRole('button', { name: 'Remove machine' }).click();
    // the question takes the focus, so a keyboard user hears what will happen
    expect(await page.evaluate(() => document.activeElement?.textContent)).toMatch(/archived instead/);
    await page.getByRole('button', { name: 'Yes, remove' }).click();
    await page.getByText(/^Archived on /).waitFor();
    expect(await machine.versionLead()).toMatch(/· archived/);
    expect(await page.getByRole('link', { name: 'Edit profile' }).count()).toBe(0);
    await shot(page, 'machine-archived');
    await page.getByRole('button', { name: 'Restore machine' }).click();
    await page.getByRole('button', { name: 'Yes, restore' }).click();
    await page.getByRole('link', { name: 'Edit profile' }).waitFor();

    await machine.open(machineId);
    await page.getByRole('button', { name: 'Remove machine' }).click();
    await page.getByRole('button', { name: 'Yes, remove' }).click();
    await page.waitForURL(/\/machines\?removed=1$/);
    expect(await dbm.db.select().from(s.machines).where(eq(s.machines.id, machineId))).toEqual([]);
    await page.close();
  });
});

describe('programmer and operator', () => {
  it.each(['priya', 'lena'])('%s reads the machine and materials pages without any control that changes them', async (who) => {
    const [router] = await dbm.db.select().from(s.machines).where(eq(s.machines.name, 'Router 1'));
    const page = await signedInPage(`${who}@alder-finch.example`);
    const machine = new MachinePage(page, server.baseUrl);
    await machine.open(router.id);
    await page.getByTestId('profile-view').first().waitFor();
    for (const name of ['Edit profile', 'Edit']) expect(await page.getByRole('link', { name, exact: true }).count()).toBe(0);
    expect(await page.locator('main form').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Remove machine' }).count()).toBe(0);
    await shot(page, `machine-page-${who}`);
    const forbidden = await page.goto(`${server.baseUrl}/machines/new`);
    expect(forbidden?.status()).toBe(403);
    await page.goto(`${server.baseUrl}/materials`);
    await page.getByRole('table', { name: "Your shop's materials" }).waitFor();
    expect(await page.locator('main form').count()).toBe(0);
    await page.close();
  });
});

describe('materials page', () => {
  it('adds a material typed in inches and euros; the list shows it in the shop units', async () => {
    const page = await signedInPage('ada@alder-finch.example');
    const materials = new MaterialsPage(page, server.baseUrl);
    await materials.open();
    expect(await materials.rowText('Birch plywood 18 mm')).toContain('€89.00');
    await materials.add({ Name: 'Test M ABS 1/8 in', 'Thickness (in)': '1/8', 'Sheet width (in)': '48', 'Sheet length (in)': '96', 'Cost per sheet (EUR)': '42.505' });
    expect(await materials.fieldError('Cost per sheet (EUR)')).toBe('Cost per sheet: Use at most 2 decimals.');
    await materials.add({ 'Cost per sheet (EUR)': '42.50' });
    expect(await materials.statusMessage()).toBe('Test M ABS 1/8 in added.');
    expect(await materials.rowText('Test M ABS 1/8 in')).toBe('Test M ABS 1/8 in 0.125 48 × 96 €42.50 0');
    const [row] = await dbm.db.select().from(s.materials).where(eq(s.materials.name, 'Test M ABS 1/8 in'));
    // 1/8 in = 3.175 mm; 4 × 8 ft = 1219.2 × 2438.4 mm (25.4 mm per inch)
    expect(row).toMatchObject({ thicknessMm: 3.175, sheetWidthMm: 1219.2, sheetLengthMm: 2438.4, costPerSheetMinor: 4250 });
    await shot(page, 'materials');

    await page.getByRole('link', { name: 'Test M ABS 1/8 in' }).click();
    const edit = page.getByRole('form', { name: 'Edit material' });
    expect(await edit.getByLabel('Thickness (in)').inputValue()).toBe('0.125');
    await edit.getByLabel('Cost per sheet (EUR)').fill('44');
    await shot(page, 'material-edit');
    await edit.getByRole('button', { name: 'Save material' }).click();
    await page.waitForURL(/\/materials\?saved=1$/);
    expect(await materials.rowText('Test M ABS 1/8 in')).toContain('€44.00');
    const [saved] = await dbm.db.select().from(s.materials).where(eq(s.materials.name, 'Test M ABS 1/8 in'));
    expect(saved).toMatchObject({ thicknessMm: 3.175, costPerSheetMinor: 4400 });
    await page.close();
  });
});
