// lib/mail against the SMTP capture that scripts/services-start.sh runs: a message sent
// with nodemailer arrives, and the capture's JSON list shows its sender, recipients,
// subject, text and attachment names. Matched by a unique subject, so mail sent by
// other tests at the same time does not disturb it.
import { randomBytes } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { closeMailer, sendMail } from '@/lib/mail/mailer';
import { env } from '@/lib/env';

interface Captured {
  from: string | null;
  to: string[];
  subject: string;
  text: string;
  attachments: { filename: string | null; contentType: string; size: number }[];
}

async function waitForMail(subject: string, timeoutMs = 10_000): Promise<Captured> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await fetch(`${env.MAIL_CAPTURE_URL}/messages`);
    expect(res.status).toBe(200);
    const found = ((await res.json()) as Captured[]).find((m) => m.subject === subject);
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no captured mail with subject "${subject}" within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('outgoing mail (SMTP capture)', () => {
  afterAll(() => closeMailer());

  it('delivers a quote mail with its attachment to the capture', async () => {
    const subject = `Quote Q-${randomBytes(3).toString('hex')}: cutting-board blanks`;
    const pdf = Buffer.from('%PDF-1.4\n% quote\n');
    const sent = await sendMail({
      to: ['orders@marlow-street-bakery.example', 'tomas@alder-finch.example'],
      subject,
      text: 'Dear Marlow Street Bakery,\nplease find our quote attached.\n',
      attachments: [{ filename: 'quote.pdf', content: pdf, contentType: 'application/pdf' }],
    });
    expect(sent.accepted).toEqual(['orders@marlow-street-bakery.example', 'tomas@alder-finch.example']);
    expect(sent.rejected).toEqual([]);

    const mail = await waitForMail(subject);
    expect(mail.from).toBe(env.MAIL_FROM.match(/<([^>]+)>/)?.[1] ?? env.MAIL_FROM);
    expect(mail.to).toEqual(['orders@marlow-street-bakery.example', 'tomas@alder-finch.example']);
    expect(mail.text).toContain('please find our quote attached.');
    expect(mail.attachments).toEqual([{ filename: 'quote.pdf', contentType: 'application/pdf', size: pdf.length }]);
  });

  it('keeps non-ASCII subjects and text intact (RFC 2047 / UTF-8 body)', async () => {
    const subject = `Tisch 1530 × 3060 mm — Angebot ${randomBytes(3).toString('hex')}`;
    await sendMail({ to: 'lena@alder-finch.example', subject, text: 'Größe: 1220 × 2440 mm, Ø 6,35 mm\n' });
    const mail = await waitForMail(subject);
    expect(mail.text).toContain('Größe: 1220 × 2440 mm, Ø 6,35 mm');
  });
});
