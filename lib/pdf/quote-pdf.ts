import 'server-only';
// The quote as a PDF (pdfkit, A4), set in the shipped Atkinson Hyperlegible files of
// public/fonts (SIL Open Font License, beside them). Shop name and address, customer, job,
// the lines with their arithmetic, totals, validity, terms, and the caution that the cut
// time is an estimate. The fonts hold the Latin set only: signs outside it are written out.
import path from 'node:path';
import PDFDocument from 'pdfkit';
import { formatMoney, type PriceLine } from '@/lib/quotes/price';

const FONT_DIR = path.join(process.cwd(), 'public', 'fonts', 'atkinson-hyperlegible');
const REGULAR = path.join(FONT_DIR, 'atkinson-hyperlegible-latin-400-normal.woff2');
const BOLD = path.join(FONT_DIR, 'atkinson-hyperlegible-latin-700-normal.woff2');

export const ESTIMATE_CAUTION =
  'The machine time in this quote is an estimate computed from the cutting program; the actual time on the machine can differ. ' +
  'Checks Kerfcast makes on a program are an aid, not a guarantee: the machine’s manual, the shop’s safety rules, local codes and a trained operator decide how a job is run.';

export interface QuotePdfInput {
  number: string;
  issuedOn: string;
  validUntil: string | null;
  validityDays: number;
  shopName: string;
  shopAddress: string;
  customerName: string;
  jobTitle: string;
  currency: string;
  totalMinor: number;
  lines: PriceLine[];
  terms: string;
}

/** Characters the shipped Latin subset lacks, written out. */
function latin(text: string): string {
  return text.replace(/⌈/g, 'ceil(').replace(/⌉/g, ')').replace(/−/g, '-').replace(/≥/g, '>=');
}

const TOTAL_KEYS = new Set(['subtotal', 'margin', 'rounding', 'net', 'tax', 'total']);

export function quotePdf(q: QuotePdfInput): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4', margin: 56, font: REGULAR, info: { Title: `Quote ${q.number}`, Author: q.shopName } });
    doc.registerFont('regular', REGULAR);
    doc.registerFont('bold', BOLD);
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    const money = (m: number) => latin(formatMoney(m, q.currency));
    const left = doc.page.margins.left;
    const width = doc.page.width - left - doc.page.margins.right;
    const amountW = 110;

    doc.font('bold').fontSize(18).text(latin(q.shopName));
    if (q.shopAddress.trim()) doc.font('regular').fontSize(10).text(latin(q.shopAddress));
    doc.moveDown(1.2);
    doc.font('bold').fontSize(16).text(`Quote ${q.number}`);
    doc.font('regular').fontSize(10);
    doc.text(`Issued ${q.issuedOn}`);
    doc.text(q.validUntil ? `Valid until ${q.validUntil}` : `Valid for ${q.validityDays} days from sending`);
    doc.moveDown(0.6);
    doc.text(`Customer: ${latin(q.customerName)}`);
    doc.text(`Job: ${latin(q.jobTitle)}`);
    doc.moveDown(1);

    for (const line of q.lines) {
      const isTotal = TOTAL_KEYS.has(line.key);
      if (line.key === 'subtotal') {
        doc.moveTo(left, doc.y).lineTo(left + width, doc.y).lineWidth(0.5).stroke();
        doc.moveDown(0.3);
      }
      const y = doc.y;
      doc.font(line.key === 'total' ? 'bold' : 'regular').fontSize(line.key === 'total' ? 12 : 10);
      doc.text(latin(line.label), left, y, { width: width - amountW - 10 });
      const afterLabel = doc.y;
      if (line.amountMinor !== null) doc.text(money(line.amountMinor), left + width - amountW, y, { width: amountW, align: 'right' });
      doc.y = afterLabel;
      if (!isTotal || line.key === 'margin' || line.key === 'tax' || line.key === 'rounding') {
        doc.font('regular').fontSize(8).fillColor('#444444').text(latin(line.arithmetic), left, doc.y, { width: width - amountW - 10 });
        doc.fillColor('#000000');
      }
      doc.moveDown(0.4);
    }
    doc.moveDown(0.6);
    doc.font('bold').fontSize(12).text(`Total ${money(q.totalMinor)}`, left, doc.y, { width, align: 'right' });
    doc.moveDown(1.2);
    if (q.terms.trim()) {
      doc.font('bold').fontSize(10).text('Terms', left);
      doc.font('regular').fontSize(9).text(latin(q.terms), { width });
      doc.moveDown(0.8);
    }
    doc.font('bold').fontSize(10).text('About the machine time', left);
    doc.font('regular').fontSize(9).text(latin(ESTIMATE_CAUTION), { width });
    doc.end();
  });
}
