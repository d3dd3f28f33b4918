// Page object of the signed-in shell: the main navigation, the role shown, sign-out.
import type { Page } from 'playwright-core';

export class AppShell {
  constructor(private readonly page: Page) {}

  async waitUntilSignedIn(): Promise<void> {
    await this.page.getByTestId('main-nav').waitFor();
  }

  async navLabels(): Promise<string[]> {
    const links = this.page.getByTestId('main-nav').getByRole('link');
    return (await links.allInnerTexts()).map((t) => t.trim());
  }

  async roleShown(): Promise<string> {
    return (await this.page.getByTestId('user-role').innerText()).trim();
  }

  async currentPageLabel(): Promise<string | null> {
    const current = this.page.getByTestId('main-nav').locator('[aria-current="page"]');
    return (await current.count()) > 0 ? (await current.innerText()).trim() : null;
  }

  async signOut(): Promise<void> {
    await this.page.getByRole('button', { name: 'Sign out' }).click();
    await this.page.waitForURL(/\/sign-in/);
  }
}
