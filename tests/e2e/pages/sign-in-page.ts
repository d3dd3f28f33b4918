// Page object of /sign-in.
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../integration/support/app-server';
import type { BrowserSession } from '../support/browser';

export class SignInPage {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async open(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/sign-in`);
  }

  /** Types like a person: field, Tab, field, Enter. */
  async signIn(email: string, password: string): Promise<void> {
    await this.page.getByLabel('E-mail').fill(email);
    await this.page.keyboard.press('Tab');
    await this.page.keyboard.type(password);
    await this.page.keyboard.press('Enter');
  }

  async errorText(): Promise<string> {
    const title = this.page.getByTestId('sign-in-error').locator('[data-part="title"]');
    await title.waitFor();
    return (await title.innerText()).trim();
  }

  /** Focus moves to the message one frame after it appears; wait for that, briefly. */
  async isFocusedOnError(): Promise<boolean> {
    return this.page
      .waitForFunction(() => document.activeElement?.getAttribute('data-testid') === 'sign-in-error', undefined, { timeout: 5000 })
      .then(() => true)
      .catch(() => false);
  }
}

/**
 * A new page of the browser's context, its cookies cleared, signed in as `email` with the demo
 * password and waiting on its landing page (admins and estimators land on the dashboard, the
 * others on the jobs page).
 */
export async function signInAs(browser: BrowserSession, baseUrl: string, email: string): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  const signIn = new SignInPage(page, baseUrl);
  await signIn.open();
  await signIn.signIn(email, DEMO_PASSWORD);
  await page.waitForURL(/\/(dashboard|jobs)$/);
  return page;
}
