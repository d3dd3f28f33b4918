// Outgoing mail (quotes to customers, notices to users) through nodemailer and the SMTP
// relay named by SMTP_URL; locally that is the capture server of scripts/smtp-fake.ts.
// Server-only.
import nodemailer, { type Transporter } from 'nodemailer';
import { env } from '@/lib/env';

export interface MailAttachment {
  filename: string;
  content: Buffer | string;
  contentType?: string;
}

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  replyTo?: string;
  attachments?: MailAttachment[];
}

export interface SentMail {
  messageId: string;
  accepted: string[];
  rejected: string[];
}

export function createTransport(smtpUrl: string = env.SMTP_URL): Transporter {
  return nodemailer.createTransport(smtpUrl);
}

const globalForMail = globalThis as unknown as { kerfcastMailer?: Transporter };

function transport(): Transporter {
  return (globalForMail.kerfcastMailer ??= createTransport());
}

const addressText = (a: string | { address: string }) => (typeof a === 'string' ? a : a.address);

export async function sendMail(mail: OutgoingMail): Promise<SentMail> {
  const info = await transport().sendMail({
    from: env.MAIL_FROM,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    replyTo: mail.replyTo,
    attachments: mail.attachments,
  });
  return {
    messageId: String(info.messageId),
    accepted: (info.accepted ?? []).map(addressText),
    rejected: (info.rejected ?? []).map(addressText),
  };
}

/** Closes pooled SMTP connections (scripts and tests, so the process can exit). */
export function closeMailer(): void {
  globalForMail.kerfcastMailer?.close();
  delete globalForMail.kerfcastMailer;
}
