// Page object of /jobs: the SWR-loaded table.
import type { Page } from 'playwright-core';

export class JobsPage {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async open(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/jobs`);
  }

  /** Waits until the table replaced the loading state, then returns the job titles. */
  async titles(): Promise<string[]> {
    const rows = this.page.getByRole('table', { name: "Your shop's jobs" }).locator('tbody tr');
    await rows.first().waitFor();
    return (await rows.locator('td:first-child').allInnerTexts()).map((t) => t.trim());
  }

  async statusTexts(): Promise<string[]> {
    const cells = this.page.getByRole('table', { name: "Your shop's jobs" }).locator('tbody tr td:last-child');
    return (await cells.allInnerTexts()).map((t) => t.trim());
  }
}
