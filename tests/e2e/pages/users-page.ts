// Page object of /admin/users: the users table with its row controls and the
// create-user form.
import { FormPage } from './form-page';

export class UsersPage extends FormPage {

  async open(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/admin/users`);
  }

  protected form() {
    return this.page.getByRole('form', { name: 'New user' });
  }

  async create(values: { name: string; email: string; role: string; password: string }): Promise<void> {
    const form = this.form();
    await form.getByLabel('Name').fill(values.name);
    await form.getByLabel('E-mail').fill(values.email);
    await form.getByLabel('Role').selectOption(values.role);
    await form.getByLabel('Their password').fill(values.password);
    await form.getByRole('button', { name: 'Create user' }).click();
  }

  private row(email: string) {
    return this.page.getByRole('table', { name: "Your shop's users" }).locator('tbody tr', { hasText: email });
  }

  async signInState(email: string): Promise<string> {
    return (await this.row(email).locator('td').nth(3).innerText()).trim();
  }

  /** Picks a role in the row's own form and returns the message the row then shows. */
  async changeRole(email: string, roleLabel: string): Promise<string> {
    const row = this.row(email);
    await row.getByRole('combobox').selectOption({ label: roleLabel });
    await row.getByRole('button', { name: 'Change role' }).click();
    const status = row.getByRole('status');
    await status.waitFor();
    return (await status.innerText()).replace('✓', '').trim();
  }

  async toggleDisabled(email: string, expectedAfter: 'Disabled' | 'Enabled'): Promise<void> {
    await this.row(email).getByRole('button', { name: expectedAfter === 'Disabled' ? 'Disable' : 'Enable' }).click();
    await this.row(email).locator('td').nth(3).filter({ hasText: expectedAfter }).waitFor();
  }
}
