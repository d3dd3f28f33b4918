// Page object of /customers: the list and the create-customer form.
import type { Page } from 'playwright-core';

export class CustomersPage {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async open(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/customers`);
  }

  private form() {
    return this.page.getByRole('form', { name: 'New customer' });
  }

  async fill(values: { name?: string; email?: string; phone?: string }): Promise<void> {
    const form = this.form();
    if (values.name !== undefined) await form.getByLabel('Name').fill(values.name);
    if (values.email !== undefined) await form.getByLabel('E-mail').fill(values.email);
    if (values.phone !== undefined) await form.getByLabel('Phone').fill(values.phone);
  }

  async submit(): Promise<void> {
    await this.form().getByRole('button', { name: 'Add customer' }).click();
  }

  async fieldError(label: string): Promise<string> {
    const input = this.form().getByLabel(label, { exact: true });
    const id = await input.getAttribute('id');
    const error = this.page.locator(`#${id}-error`);
    await error.waitFor();
    return (await error.innerText()).replace('▲', '').trim();
  }

  async statusMessage(): Promise<string> {
    const status = this.form().locator('[role="status"] [data-part="title"]');
    await status.waitFor();
    return (await status.innerText()).trim();
  }

  async names(): Promise<string[]> {
    const cells = this.page.getByRole('table', { name: 'Customers of your shop' }).locator('tbody tr td:first-child');
    return (await cells.allInnerTexts()).map((t) => t.trim());
  }
}
