// Page object of /sign-in.
import type { Page } from 'playwright-core';

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
