// What every page object with one create form shares: reading a field's error and the form's
// status message the way a person sees them (the error is tied to its field by aria ids).
import type { Locator, Page } from 'playwright-core';

export abstract class FormPage {
  constructor(protected readonly page: Page, protected readonly baseUrl: string) {}

  /** the form the page object drives, found by its accessible name */
  protected abstract form(): Locator;

  async fieldError(label: string): Promise<string> {
    const id = await this.form().getByLabel(label, { exact: true }).getAttribute('id');
    const error = this.page.locator(`#${id}-error`);
    await error.waitFor();
    return (await error.innerText()).replace('▲', '').trim();
  }

  async statusMessage(): Promise<string> {
    const status = this.form().locator('[role="status"] [data-part="title"]');
    await status.waitFor();
    return (await status.innerText()).trim();
  }
}
