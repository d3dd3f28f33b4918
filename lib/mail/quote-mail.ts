import 'server-only';
// "Send to customer": the quote's PDF and a link to /q/{token} mailed to the job's customer.
// Every message is logged in mail_log (sending → sent | failed with the server's reason);
// the quote is marked sent, with the token's hash, only after the SMTP server accepted the
// message. A refused message leaves the quote a draft, so the send can be tried again.
import { finishMailLog, getQuoteRow, logMail, markQuoteSent, newToken, quoteContext } from '@/db/queries/quotes';
import { env } from '@/lib/env';
import { AppError } from '@/lib/errors';
import { quotePdf } from '@/lib/pdf/quote-pdf';
import { formatMoney, type PriceLine } from '@/lib/quotes/price';
import type { QuoteRow } from '@/db/schema';
import { sendMail } from './mailer';

const dateOnly = (d: Date) => d.toISOString().slice(0, 10);

function addDays(days: number): string {
  const d = new Date();
  d.setUTCDate(d.getUTCDate() + days);
  return dateOnly(d);
}

/** The quote's PDF as it stands (a draft shows the validity it will have once sent). */
export async function pdfForQuote(shopId: number, row: QuoteRow, validUntil: string | null = row.validUntil): Promise<Buffer> {
  const ctx = await quoteContext(shopId, row.jobId);
  return quotePdf({
    number: row.number,
    issuedOn: dateOnly(row.sentAt ?? row.createdAt),
    validUntil,
    validityDays: row.validityDays,
    shopName: ctx.shopName,
    shopAddress: ctx.shopAddress,
    customerName: ctx.customerName,
    jobTitle: ctx.jobTitle,
    currency: row.currency,
    totalMinor: row.totalMinor,
    lines: row.lines as PriceLine[],
    terms: ctx.quoteTerms,
  });
}

export async function sendQuoteToCustomer(shopId: number, userId: number, quoteId: number): Promise<void> {
  const row = await getQuoteRow(shopId, quoteId);
  if (!row) throw new AppError('not-found:quote', 'No such quote.');
  if (row.status !== 'draft') throw new AppError('conflict:quote-status', `Quote ${row.number} is ${row.status}; only a draft is sent. Make a revision to send a changed quote.`);
  const ctx = await quoteContext(shopId, row.jobId);
  const { token, hash } = newToken();
  const link = `${env.APP_URL.replace(/\/$/, '')}/q/${token}`;
  const validUntil = addDays(row.validityDays);
  const pdf = await pdfForQuote(shopId, row, validUntil);
  const subject = `Quote ${row.number} from ${ctx.shopName}: ${ctx.jobTitle}`;
  const text = [
    `Dear ${ctx.customerName},`,
    '',
    `Please find our quote ${row.number} for "${ctx.jobTitle}" attached: ${formatMoney(row.totalMinor, row.currency)} in total, valid until ${validUntil}.`,
    '',
    `You can accept or decline it here: ${link}`,
    '',
    'The machine time in the quote is an estimate computed from the cutting program.',
    '',
    ctx.shopName,
  ].join('\n');
  const logId = await logMail({ shopId, quoteId: row.id, toAddress: ctx.customerEmail, subject, sentBy: userId });
  try {
    const sent = await sendMail({ to: ctx.customerEmail, subject, text, attachments: [{ filename: `${row.number}.pdf`, content: pdf, contentType: 'application/pdf' }] });
    if (sent.accepted.length === 0) throw new Error(`the server refused ${sent.rejected.join(', ') || ctx.customerEmail}`);
    await finishMailLog(logId, { ok: true, messageId: sent.messageId });
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    await finishMailLog(logId, { ok: false, error: reason });
    throw new AppError('conflict:mail-failed', `The mail to ${ctx.customerEmail} was not sent: ${reason}. The quote is still a draft; try again.`);
  }
  await markQuoteSent(shopId, userId, row, hash);
}
