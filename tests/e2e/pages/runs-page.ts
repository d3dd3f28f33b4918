// Page objects of the runs parts: the Runs section of a program page (the timer and its forms)
// and the calibration panel of a machine page.
import type { Locator, Page } from 'playwright-core';

export class ProgramRunsSection {
  readonly root: Locator;

  constructor(private readonly page: Page, private readonly baseUrl: string) {
    this.root = page.getByTestId('program-runs');
  }

  async open(jobId: number, programId: number): Promise<void> {
    await this.page.goto(`${this.baseUrl}/jobs/${jobId}/programs/${programId}`);
    await this.root.waitFor();
  }

  clock(): Locator {
    return this.root.getByTestId('run-clock');
  }

  /** Waits until the timer shows the state (running or paused) and returns its face. */
  async waitForState(state: 'running' | 'paused'): Promise<string> {
    await this.root.locator(`[data-testid="run-clock"][data-state="${state}"]`).waitFor();
    return (await this.clock().getByTestId('run-time').innerText()).trim();
  }

  /** Waits until the face shows a later time than `face` (the clock ticks once a second). */
  async waitForTickPast(face: string): Promise<string> {
    const seconds = (f: string) => f.split(':').reduce((acc, part) => acc * 60 + Number(part), 0);
    const before = seconds(face);
    await this.page.waitForFunction(
      ([sel, s]) => {
        const text = document.querySelector(sel as string)?.textContent?.trim() ?? '';
        return text.split(':').reduce((acc, part) => acc * 60 + Number(part), 0) > (s as number);
      },
      ['[data-testid="run-time"]', before] as const,
    );
    return (await this.clock().getByTestId('run-time').innerText()).trim();
  }

  async start(): Promise<void> {
    await this.root.getByRole('button', { name: 'Start the timer' }).click();
  }

  /** Presses Start and returns the refusal the form shows (the machine already has an open run). */
  async startRefused(): Promise<string> {
    await this.start();
    const alert = this.root.getByRole('alert').filter({ hasText: 'already has a run open' });
    await alert.waitFor();
    return (await alert.innerText()).trim();
  }

  /** The run rows that offer the signed-in user a correction form. */
  correctable(): Locator {
    return this.root.getByTestId('run-row').filter({ has: this.page.locator('summary', { hasText: /^Correct/ }) });
  }

  /** Corrects the newest run's notes (with the reason) and waits for its audit list to show the change. */
  async correctNotes(row: Locator, notes: string, reason: string): Promise<string[]> {
    await row.locator('summary', { hasText: /^Correct/ }).click();
    await row.getByLabel('Notes', { exact: true }).fill(notes);
    await row.getByLabel('Why (kept with the change)').fill(reason);
    await row.getByRole('button', { name: 'Save correction' }).click();
    const changes = row.getByTestId('run-changes');
    await changes.locator('summary').click();
    await changes.getByTestId('run-change').first().waitFor();
    return (await changes.getByTestId('run-change').allInnerTexts()).map((t) => t.replace(/\s+/g, ' ').trim());
  }

  async press(name: 'Pause' | 'Resume'): Promise<void> {
    await this.root.getByRole('button', { name, exact: true }).click();
  }

  async finish(values: { sheets: string; interrupted?: boolean; notes?: string }): Promise<void> {
    await this.root.getByLabel('Sheets cut').first().fill(values.sheets);
    if (values.interrupted) await this.root.getByLabel(/The run was interrupted \(left out/).check();
    if (values.notes) await this.root.getByLabel('Notes (optional)').first().fill(values.notes);
    await this.root.getByRole('button', { name: 'Finish run' }).click();
  }

  /** The statuses of the earlier runs listed, newest first, once at least `n` are shown. */
  async runStatuses(n: number): Promise<string[]> {
    await this.root.getByTestId('run-row').nth(n - 1).waitFor();
    return this.root.getByTestId('run-row').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-status') ?? ''));
  }
}

export class CalibrationPanel {
  readonly root: Locator;

  constructor(private readonly page: Page, private readonly baseUrl: string) {
    this.root = page.getByTestId('calibration-panel');
  }

  async open(machineId: number): Promise<void> {
    await this.page.goto(`${this.baseUrl}/machines/${machineId}`);
    await this.root.waitFor();
  }

  async figure(testId: 'calibration-suggested' | 'calibration-runs' | 'calibration-current'): Promise<string> {
    return (await this.root.getByTestId(testId).innerText()).trim();
  }

  async message(): Promise<string> {
    return (await this.root.getByTestId('calibration-message').innerText()).trim();
  }

  async apply(): Promise<string> {
    await this.root.getByRole('button', { name: /^Apply × / }).click();
    const notice = this.root.getByRole('status').filter({ hasText: 'Applied' });
    await notice.waitFor();
    return (await notice.locator('[data-part="title"]').innerText()).trim();
  }
}

/** The stored estimate's raw and calibrated times on a program page, and its re-estimate notice. */
export class EstimateTimesPart {
  readonly root: Locator;

  constructor(private readonly page: Page) {
    this.root = page.getByTestId('estimate-times');
  }

  async figures(): Promise<{ raw: string; calibrated: string; factor: string }> {
    await this.root.waitFor();
    const text = async (id: string) => (await this.root.getByTestId(id).innerText()).trim();
    return { raw: await text('estimate-raw'), calibrated: await text('estimate-calibrated'), factor: await text('estimate-factor') };
  }

  /** Presses "Estimate on profile version N" and waits until the page shows the factor of the new estimate. */
  async estimateOnCurrentVersion(version: number, factorText: string): Promise<void> {
    await this.root.getByRole('button', { name: `Estimate on profile version ${version}` }).click();
    await this.page.getByTestId('estimate-factor').filter({ hasText: factorText }).waitFor({ timeout: 90_000 });
  }
}
