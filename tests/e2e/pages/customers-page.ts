// Page object of /customers: the list and the create-customer form.
import { FormPage } from './form-page';

export class CustomersPage extends FormPage {

  async open(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/customers`);
  }

  protected form() {
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

  async names(): Promise<string[]> {
    const cells = this.page.getByRole('table', { name: "Your shop's customers" }).locator('tbody tr td:first-child');
    return (await cells.allInnerTexts()).map((t) => t.trim());
  }
}
