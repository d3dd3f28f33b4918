import 'server-only';
// The quote as a PDF (pdfkit, A4), set in the shipped Atkinson Hyperlegible (public/fonts, SIL
// Open Font License beside it) as TrueType: the .ttf files are the shipped .woff2 files
// decompressed (WOFF 2.0, W3C Recommendation §5: the font data is the original sfnt), because a
// PDF font program must be TrueType, CFF or OpenType (ISO 32000-1 §9.9) and viewers draw an
// embedded WOFF2 file as a blank page. pdfkit embeds the subset of glyphs used (FontFile2).
// Shop name and address, customer, job, the lines with their arithmetic, totals, validity,
// terms, and the caution that the cut time is an estimate. The font holds Latin letters only:
// signs outside the WinAnsi set (⌈ ⌉ ≥ …) are written out or reduced to their letter.
import path from 'node:path';
import PDFDocument from 'pdfkit';
import { formatMoney, type PriceLine } from '@/lib/quotes/price';

const FONT_DIR = path.join(process.cwd(), 'public', 'fonts', 'atkinson-hyperlegible');
export const PDF_FONT_FILES = {
  regular: path.join(FONT_DIR, 'atkinson-hyperlegible-latin-400-normal.ttf'),
  bold: path.join(FONT_DIR, 'atkinson-hyperlegible-latin-700-normal.ttf'),
} as const;
const REGULAR = 'regular';
const BOLD = 'bold';

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

// WinAnsiEncoding's characters above 0x7F outside Latin-1 (ISO 32000-1 Annex D.2)
const WIN_ANSI_EXTRA = new Set('€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ');
const SPELLED: Record<string, string> = { '⌈': 'ceil(', '⌉': ')', '⌊': 'floor(', '⌋': ')', '−': '-', '≥': '>=', '≤': '<=', '≈': '~', '→': '->', '\u00a0': ' ', '\u202f': ' ' };

/** Text the standard fonts can show: WinAnsi characters kept, a few signs written out, others reduced to their base letter or '?'. */
export function winAnsi(text: string): string {
  let out = '';
  for (const ch of text) {
    const code = ch.codePointAt(0)!;
    if (SPELLED[ch] !== undefined) out += SPELLED[ch];
    else if (code === 0x0a || (code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || WIN_ANSI_EXTRA.has(ch)) out += ch;
    else {
      const base = ch.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
      out += base && [...base].every((c) => c.charCodeAt(0) <= 0xff) ? base : '?';
    }
  }
  return out;
}
const latin = winAnsi;

const TOTAL_KEYS = new Set(['subtotal', 'margin', 'rounding', 'net', 'tax', 'total']);

export function quotePdf(q: QuotePdfInput): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    // the shipped font from the start, so pdfkit's own default (Helvetica) is never set up
    const doc = new PDFDocument({ size: 'A4', margin: 56, font: PDF_FONT_FILES.regular, info: { Title: `Quote ${q.number}`, Author: q.shopName } });
    doc.registerFont(REGULAR, PDF_FONT_FILES.regular);
    doc.registerFont(BOLD, PDF_FONT_FILES.bold);
    doc.font(REGULAR);
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    const money = (m: number) => latin(formatMoney(m, q.currency));
    const left = doc.page.margins.left;
    const width = doc.page.width - left - doc.page.margins.right;
    const amountW = 110;

    doc.font(BOLD).fontSize(18).text(latin(q.shopName));
    if (q.shopAddress.trim()) doc.font(REGULAR).fontSize(10).text(latin(q.shopAddress));
    doc.moveDown(1.2);
    doc.font(BOLD).fontSize(16).text(`Quote ${q.number}`);
    doc.font(REGULAR).fontSize(10);
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
      doc.font(line.key === 'total' ? BOLD : REGULAR).fontSize(line.key === 'total' ? 12 : 10);
      doc.text(latin(line.label), left, y, { width: width - amountW - 10 });
      const afterLabel = doc.y;
      if (line.amountMinor !== null) doc.text(money(line.amountMinor), left + width - amountW, y, { width: amountW, align: 'right' });
      doc.y = afterLabel;
      if (!isTotal || line.key === 'margin' || line.key === 'tax' || line.key === 'rounding') {
        doc.font(REGULAR).fontSize(8).fillColor('#444444').text(latin(line.arithmetic), left, doc.y, { width: width - amountW - 10 });
        doc.fillColor('#000000');
      }
      doc.moveDown(0.4);
    }
    doc.moveDown(0.6);
    doc.font(BOLD).fontSize(12).text(`Total ${money(q.totalMinor)}`, left, doc.y, { width, align: 'right' });
    doc.moveDown(1.2);
    if (q.terms.trim()) {
      doc.font(BOLD).fontSize(10).text('Terms', left);
      doc.font(REGULAR).fontSize(9).text(latin(q.terms), { width });
      doc.moveDown(0.8);
    }
    doc.font(BOLD).fontSize(10).text('About the machine time', left);
    doc.font(REGULAR).fontSize(9).text(latin(ESTIMATE_CAUTION), { width });
    doc.end();
  });
}
