// Page object of /jobs/[jobId]: the facts, status, the upload widget, the programs with their
// estimates (findings, parts) and the history.
import type { Locator, Page } from 'playwright-core';

/** The text a screen reader reads: without the aria-hidden glyphs, white space collapsed. */
async function readable(locator: Locator): Promise<string[]> {
  return locator.evaluateAll((els) =>
    els.map((el) => {
      const copy = el.cloneNode(true) as HTMLElement;
      copy.querySelectorAll('[aria-hidden="true"]').forEach((n) => n.remove());
      return (copy.textContent ?? '').replace(/\s+/g, ' ').trim();
    }),
  );
}

export class JobPage {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async open(jobId: number): Promise<void> {
    await this.page.goto(`${this.baseUrl}/jobs/${jobId}`);
  }

  jobIdFromUrl(): number {
    const m = /\/jobs\/(\d+)$/.exec(new URL(this.page.url()).pathname);
    if (!m) throw new Error(`not on a job page: ${this.page.url()}`);
    return Number(m[1]);
  }

  async title(): Promise<string> {
    return (await this.page.getByRole('heading', { level: 1 }).innerText()).trim();
  }

  async status(): Promise<string> {
    return (await this.page.getByTestId('job-status').innerText()).trim();
  }

  async history(): Promise<string[]> {
    const items = this.page.getByTestId('job-history').locator('li > p:first-child');
    return (await items.allInnerTexts()).map((t) => t.trim());
  }

  uploadWidget(): Locator {
    return this.page.getByTestId('upload-widget');
  }

  async hasUploadControl(): Promise<boolean> {
    return (await this.uploadWidget().count()) > 0 || (await this.page.locator('input[type="file"]').count()) > 0;
  }

  /** Chooses files with the file picker (the labelled <input type="file">). */
  async chooseFiles(paths: string[]): Promise<void> {
    await this.page.getByLabel('Choose program files').setInputFiles(paths);
  }

  uploadItem(name: string): Locator {
    return this.page.getByTestId('upload-item').filter({ hasText: name });
  }

  /**
   * Starts recording every state the upload rows go through (a MutationObserver on the widget),
   * so a quick upload's short 'sending' moment is not missed between two looks.
   */
  async recordUploadRows(): Promise<void> {
    await this.uploadWidget().evaluate((widget) => {
      const log: { state: string | null; value: number; text: string }[] = [];
      (window as unknown as { kerfcastUploadLog: typeof log }).kerfcastUploadLog = log;
      const take = () => {
        for (const el of widget.querySelectorAll<HTMLElement>('[data-testid="upload-item"]')) {
          log.push({
            state: el.getAttribute('data-state'),
            value: el.querySelector('progress')?.value ?? 0,
            text: el.innerText.replace(/\s+/g, ' '),
          });
        }
      };
      new MutationObserver(take).observe(widget, { subtree: true, childList: true, attributes: true, characterData: true });
    });
  }

  async recordedUploadRows(): Promise<{ state: string | null; value: number; text: string }[]> {
    return this.page.evaluate(() => (window as unknown as { kerfcastUploadLog: { state: string | null; value: number; text: string }[] }).kerfcastUploadLog);
  }

  /** The upload's bar value (0–1) as the page holds it. */
  async uploadProgress(name: string): Promise<number> {
    return this.uploadItem(name).locator('progress').evaluate((el) => (el as HTMLProgressElement).value);
  }

  program(name: string): Locator {
    return this.page.getByTestId('program').filter({ has: this.page.getByRole('heading', { name }) });
  }

  async waitForEstimate(name: string, timeoutMs = 120_000): Promise<Locator> {
    const done = this.program(name).getByTestId('estimate-done');
    await done.waitFor({ timeout: timeoutMs });
    return done;
  }

  async findingCounts(name: string): Promise<string> {
    return (await readable(this.program(name).getByTestId('finding-counts').locator(':scope > span'))).join(' ');
  }

  async findings(name: string): Promise<string[]> {
    return readable(this.program(name).getByTestId('finding'));
  }

  async partsSummary(name: string): Promise<string> {
    return (await this.program(name).getByTestId('parts-summary').innerText()).trim();
  }

  async partRows(name: string): Promise<number> {
    return this.program(name).getByTestId('part-row').count();
  }

  async figure(name: string, label: string): Promise<string> {
    const block = this.program(name).locator('dl > div').filter({ has: this.page.locator('dt', { hasText: label }) });
    return (await block.locator('dd').first().innerText()).trim();
  }
}
