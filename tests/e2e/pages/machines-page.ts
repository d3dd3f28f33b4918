// Page objects of the machine pages: the list (with the admin's length-unit form), one
// machine (profile, tools, versions) and its edit form.
import type { Page } from 'playwright-core';
import { FormPage } from './form-page';

export class MachinesListPage {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async open(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/machines`);
  }

  /** The admin's setting: choose the unit, save, and wait for the form's answer. */
  async setLengthUnit(label: 'Millimetres (mm)' | 'Inches (in)'): Promise<string> {
    const form = this.page.getByRole('form', { name: 'Length unit' });
    await form.getByLabel('Show lengths in').selectOption({ label });
    await form.getByRole('button', { name: 'Save length unit' }).click();
    const status = form.locator('[role="status"] [data-part="title"]');
    await status.waitFor();
    return (await status.innerText()).trim();
  }

  async travelHeader(): Promise<string> {
    return (await this.page.getByRole('table', { name: 'Machines of your shop' }).locator('thead th').nth(1).innerText()).trim();
  }
}

export class MachinePage {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async open(machineId: number): Promise<void> {
    await this.page.goto(`${this.baseUrl}/machines/${machineId}`);
  }

  async versionLead(): Promise<string> {
    return (await this.page.locator('h1 + p').innerText()).trim();
  }

  async statusMessage(): Promise<string> {
    const status = this.page.locator('main [role="status"] [data-part="title"]').first();
    await status.waitFor();
    return (await status.innerText()).trim();
  }

  /** label and shown value of a profile field, from the read-only view */
  async profileField(key: string): Promise<{ label: string; value: string }> {
    const value = this.page.getByTestId('profile-view').locator(`dd[data-field="${key}"]`).first();
    const label = value.locator('xpath=preceding-sibling::dt[1]');
    return { label: (await label.innerText()).trim(), value: (await value.innerText()).trim() };
  }

  async versionNumbers(): Promise<string[]> {
    const cells = this.page.getByRole('table', { name: 'Profile versions' }).locator('tbody tr td:first-child');
    return (await cells.allInnerTexts()).map((t) => t.split('\n')[0].trim());
  }

  async changesOf(version: number): Promise<string[]> {
    const items = this.page.locator(`tr[data-version="${version}"] td:nth-child(3) > ul li`);
    return (await items.allInnerTexts()).map((t) => t.trim());
  }

  async editProfile(): Promise<void> {
    await this.page.getByRole('link', { name: 'Edit profile' }).click();
    await this.page.waitForURL(/\/edit$/);
  }
}

export class ToolFormPage extends FormPage {
  protected form() {
    return this.page.getByRole('form', { name: 'Add a tool' });
  }

  async add(values: { number: string; diameter: string; diameterLabel: string; flutes: string; kind: string }): Promise<void> {
    const form = this.form();
    await form.getByLabel('Tool number').fill(values.number);
    await form.getByLabel(values.diameterLabel).fill(values.diameter);
    await form.getByLabel('Flutes').fill(values.flutes);
    await form.getByLabel('Kind').selectOption({ label: values.kind });
    await form.getByRole('button', { name: 'Add tool' }).click();
  }

  async status(): Promise<string> {
    return this.statusMessage();
  }
}

export class MachineEditPage extends FormPage {
  constructor(page: Page, baseUrl: string, private readonly formName: 'Machine profile' | 'New machine' = 'Machine profile') {
    super(page, baseUrl);
  }

  protected form() {
    return this.page.getByRole('form', { name: this.formName });
  }

  async fill(label: string, text: string): Promise<void> {
    await this.form().getByLabel(label, { exact: true }).fill(text);
  }

  async choose(label: string, option: string): Promise<void> {
    await this.form().getByLabel(label, { exact: true }).selectOption({ label: option });
  }

  async submit(button: 'Add machine' | 'Save profile'): Promise<void> {
    await this.form().getByRole('button', { name: button }).click();
  }

  async value(label: string): Promise<string> {
    return this.form().getByLabel(label, { exact: true }).inputValue();
  }

  /** Types into a field and presses Enter, as a keyboard user saves. */
  async typeAndEnter(label: string, text: string): Promise<void> {
    const input = this.form().getByLabel(label, { exact: true });
    await input.fill(text);
    await input.press('Enter');
  }

  async save(): Promise<void> {
    await this.form().getByRole('button', { name: 'Save profile' }).click();
  }

  async focusedLabel(): Promise<string | null> {
    return this.page.evaluate(() => {
      const el = document.activeElement as HTMLInputElement | null;
      return el?.labels?.[0]?.innerText.trim() ?? null;
    });
  }
}

export class MaterialsPage extends FormPage {
  protected form() {
    return this.page.getByRole('form', { name: 'New material' });
  }

  async open(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/materials`);
  }

  async add(values: Record<string, string>): Promise<void> {
    for (const [label, text] of Object.entries(values)) await this.form().getByLabel(label, { exact: true }).fill(text);
    await this.form().getByRole('button', { name: 'Add material' }).click();
  }

  async rowText(name: string): Promise<string> {
    const row = this.page.getByRole('table', { name: "Your shop's materials" }).locator('tbody tr', { hasText: name });
    await row.waitFor();
    return (await row.innerText()).replace(/\s+/g, ' ').trim();
  }
}
