// Page object of the job form (/jobs/new and /jobs/[jobId]/edit), driven by its labels.
import { FormPage } from './form-page';

export interface JobFormFill {
  title?: string;
  customer?: string;
  machine?: string;
  material?: string;
  quantity?: string;
  dueDate?: string;
  zZero?: 'Top of stock' | 'Table surface';
  holdDown?: string;
  vacuumKpa?: string;
  notes?: string;
}

export class JobFormPage extends FormPage {
  async openNew(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/jobs/new`);
  }

  protected form() {
    return this.page.getByRole('form', { name: /^(New job|Edit job)$/ });
  }

  async fill(values: JobFormFill): Promise<void> {
    const form = this.form();
    if (values.title !== undefined) await form.getByLabel('Title').fill(values.title);
    if (values.customer !== undefined) await form.getByLabel('Customer').selectOption({ label: values.customer });
    if (values.machine !== undefined) await form.getByLabel('Machine').selectOption({ label: values.machine });
    if (values.material !== undefined) await form.getByLabel('Material').selectOption({ label: values.material });
    if (values.quantity !== undefined) await form.getByLabel('Quantity (pieces)').fill(values.quantity);
    if (values.dueDate !== undefined) await form.getByLabel('Due date').fill(values.dueDate);
    if (values.zZero !== undefined) await form.getByLabel('Z zero').selectOption({ label: values.zZero });
    if (values.holdDown !== undefined) await form.getByLabel('Hold-down method').selectOption({ label: values.holdDown });
    if (values.vacuumKpa !== undefined) await form.getByLabel('Vacuum level (kPa below atmosphere)').fill(values.vacuumKpa);
    if (values.notes !== undefined) await form.getByLabel('Notes').fill(values.notes);
  }

  async value(label: string): Promise<string> {
    return this.form().getByLabel(label, { exact: true }).inputValue();
  }

  async selectedLabel(label: string): Promise<string> {
    return this.form()
      .getByLabel(label, { exact: true })
      .evaluate((el) => (el as HTMLSelectElement).selectedOptions[0]?.textContent ?? '');
  }

  async submit(): Promise<void> {
    await this.form().getByRole('button', { name: /^(Create job|Save changes)$/ }).click();
  }

  /** the id of the element that has the keyboard focus */
  async focusedId(): Promise<string | null> {
    return this.page.evaluate(() => document.activeElement?.id ?? null);
  }
}
