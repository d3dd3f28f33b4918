// The quote PDF (lib/pdf/quote-pdf.ts): set in the PDF standard fonts Helvetica and
// Helvetica-Bold (ISO 32000-1 §9.6.2.2: every conforming reader has them), so no font
// program is embedded — an embedded WOFF2 file, which PDF does not define as a font program
// (ISO 32000-1 §9.9: Type 1, TrueType, CFF, OpenType only), made viewers draw the page blank.
// Its text read back with pdf2json (a PDF text extractor from the npm registry); characters
// outside WinAnsiEncoding (ISO 32000-1 Annex D.2) written out.
import { describe, expect, it, vi } from 'vitest';
import PDFParser from 'pdf2json';

vi.mock('server-only', () => ({}));
const { quotePdf, winAnsi } = await import('@/lib/pdf/quote-pdf');

/**
 * The text of a PDF as pdf2json extracts it. pdf2json 3.1.6 reads the Buffer's whole
 * underlying ArrayBuffer, so a small Buffer cut from Node's shared pool (byteOffset > 0) reads
 * as garbage ("Invalid XRef stream header"); the bytes go in a Buffer of their own.
 */
function pdfText(pdf: Buffer): Promise<string> {
  const own = Buffer.alloc(pdf.length);
  pdf.copy(own);
  return new Promise((resolve, reject) => {
    const parser = new PDFParser(null, true);
    parser.on('pdfParser_dataError', (e) => reject(new Error(String((e as { parserError?: unknown }).parserError ?? e))));
    parser.on('pdfParser_dataReady', () => resolve(parser.getRawTextContent()));
    parser.parseBuffer(own);
  });
}

const input = {
  number: 'Q-2026-0042',
  issuedOn: '2026-12-04',
  validUntil: '2027-01-03',
  validityDays: 30,
  shopName: 'Alder & Finch Shopfitting',
  shopAddress: '12 Kiln Yard\nNorthby',
  customerName: 'Marlow Street Bakery',
  jobTitle: 'Window display shelf brackets',
  currency: 'EUR',
  totalMinor: 123456,
  lines: [
    { key: 'sheets', label: 'Sheets', arithmetic: '⌈24 pieces ÷ 4 per sheet⌉ = 6', amountMinor: null },
    { key: 'machine', label: 'Machine: Router 1', arithmetic: '3966 s ÷ 3600 × EUR 95.00 per hour = EUR 104.66', amountMinor: 10466 },
    { key: 'total', label: 'Total', arithmetic: '', amountMinor: 123456 },
  ],
  terms: 'Payment within 30 days.',
};

describe('quote PDF', () => {
  it('uses the standard fonts and embeds no font program', async () => {
    const pdf = await quotePdf(input);
    const raw = pdf.toString('latin1');
    expect(raw.startsWith('%PDF-')).toBe(true);
    expect(raw).toMatch(/\/BaseFont \/Helvetica\b/);
    expect(raw).toMatch(/\/BaseFont \/Helvetica-Bold\b/);
    expect(raw).not.toMatch(/\/FontFile[23]?\b/);
  });

  it('reads back with the number, the lines, the total, the terms and the caution', async () => {
    const text = await pdfText(await quotePdf(input));
    expect(text).toContain('Quote Q-2026-0042');
    expect(text).toContain('Valid until 2027-01-03');
    expect(text).toContain('ceil(24 pieces ÷ 4 per sheet) = 6');
    expect(text).toContain('Total EUR 1,234.56');
    expect(text).toContain('Payment within 30 days.');
    expect(text).toMatch(/machine time in this quote is an estimate/);
  });

  it('writes out what WinAnsiEncoding lacks', () => {
    expect(winAnsi('⌈7 ÷ 2⌉ = 4, −3, ≥ 2')).toBe('ceil(7 ÷ 2) = 4, -3, >= 2');
    // Latin-1 and the WinAnsi extras stay; other letters lose their marks or become '?'
    expect(winAnsi('Größe Ø 6 mm² – “ok” €')).toBe('Größe Ø 6 mm² – “ok” €');
    expect(winAnsi('Šárka Čech')).toBe('Šárka Cech');
    expect(winAnsi('Łódź')).toBe('?ódz');
  });
});
