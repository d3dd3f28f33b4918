// Browser test of the forms: zod checks in the page before sending, the server
// action's own check shown as a field error, success shown and the list refreshed;
// an admin creates a user, changes their role and disables them, and they then cannot
// sign in.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { E2E_PORT, startAppServer, type AppServer } from '../integration/support/app-server';
import { CustomersPage } from './pages/customers-page';
import { SignInPage, signInAs } from './pages/sign-in-page';
import { UsersPage } from './pages/users-page';
import { launchBrowser, type BrowserSession } from './support/browser';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

// Invented rows of the demo scenario, removed before and after.
const CUSTOMER = { name: 'Kestrel Lane Florist', email: 'hello@kestrel-florist.example' };
const NEW_USER = { name: 'Noor Okafor', email: 'noor.e2e@alder-finch.example', role: 'operator', password: 'spoilboard-42' };

let server: AppServer;
let browser: BrowserSession;
let dbm: DbModule;
let s: Schema;

async function cleanUp() {
  await dbm.db.delete(s.customers).where(eq(s.customers.email, CUSTOMER.email));
  await dbm.db.delete(s.users).where(eq(s.users.email, NEW_USER.email));
}

beforeAll(async () => {
  server = await startAppServer(E2E_PORT);
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  await cleanUp();
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

describe('create customer (estimator)', () => {
  it('names empty and malformed fields, then adds the customer to the list', async () => {
    const page = await signedInPage('tomas@alder-finch.example');
    const customers = new CustomersPage(page, server.baseUrl);
    await customers.open();
    await customers.submit();
    expect(await customers.fieldError('Name')).toBe('Enter a name.');
    expect(await customers.fieldError('E-mail')).toBe('Enter an e-mail.');

    await customers.fill({ name: CUSTOMER.name, email: 'florist-at-example', phone: 'ring us' });
    await customers.submit();
    expect(await customers.fieldError('E-mail')).toBe('Enter an e-mail like name@example.com.');
    expect(await customers.fieldError('Phone')).toBe('Use digits, spaces and + ( ) - . / only.');

    await customers.fill({ email: CUSTOMER.email, phone: '+44 20 7946 0000' });
    await customers.submit();
    expect(await customers.statusMessage()).toBe(`Customer “${CUSTOMER.name}” added.`);
    expect(await customers.names()).toContain(CUSTOMER.name);
    await page.close();
  });
});

describe('users (admin)', () => {
  it('checks the password length in the page and a taken e-mail on the server', async () => {
    const page = await signedInPage('ada@alder-finch.example');
    const users = new UsersPage(page, server.baseUrl);
    await users.open();
    await users.create({ ...NEW_USER, password: 'short' });
    expect(await users.fieldError('Their password')).toBe('Use at least 12 characters.');
    // Only the server knows the e-mail is taken: its answer comes back as a field error.
    await users.create({ ...NEW_USER, email: 'priya@alder-finch.example' });
    expect(await users.fieldError('E-mail')).toBe('This e-mail is already in use.');
    await page.close();
  });

  it('creates a user, changes their role, disables them, and the disabled user cannot sign in', async () => {
    const page = await signedInPage('ada@alder-finch.example');
    const users = new UsersPage(page, server.baseUrl);
    await users.open();
    await users.create(NEW_USER);
    expect(await users.statusMessage()).toBe(`${NEW_USER.name} can now sign in as ${NEW_USER.email}.`);
    expect(await users.signInState(NEW_USER.email)).toContain('Enabled');
    // the role is named as a person would say it, with its label, not its code
    expect(await users.changeRole(NEW_USER.email, 'Estimator')).toBe(`${NEW_USER.name} is now an estimator.`);
    await users.toggleDisabled(NEW_USER.email, 'Disabled');
    expect(await users.signInState(NEW_USER.email)).toContain('Disabled');
    await page.close();

    await browser.context.clearCookies();
    const visitor = await browser.context.newPage();
    const signIn = new SignInPage(visitor, server.baseUrl);
    await signIn.open();
    await signIn.signIn(NEW_USER.email, NEW_USER.password);
    expect(await signIn.errorText()).toBe('Wrong e-mail or password. Check both and try again.');
    await visitor.close();
  });
});
