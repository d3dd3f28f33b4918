// The quote PDF (lib/pdf/quote-pdf.ts): set in the shipped Atkinson Hyperlegible, embedded as
// a TrueType font program (ISO 32000-1 §9.9 and §9.9 Table 126: /FontFile2 holds TrueType), the
// .ttf files being the shipped .woff2 files decompressed (W3C WOFF 2.0 §5); no standard font
// (an embedded WOFF2 file, which PDF does not define as a font program, made viewers draw the
// page blank). Its text read back with pdf2json (a PDF text extractor from the npm registry)
// through the ToUnicode map pdfkit writes; characters the font lacks written out.
import { readFileSync } from 'node:fs';
import { describe, expect, it, vi } from 'vitest';
import PDFParser from 'pdf2json';

vi.mock('server-only', () => ({}));
const { PDF_FONT_FILES, quotePdf, winAnsi } = await import('@/lib/pdf/quote-pdf');

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
  it('embeds the shipped font as TrueType subsets, regular and bold, and no standard font', async () => {
    // the shipped files are TrueType ('\0\1\0\0', OpenType spec, table directory sfntVersion) decompressed from the .woff2 beside them ('wOF2')
    for (const file of Object.values(PDF_FONT_FILES)) {
      expect(readFileSync(file).subarray(0, 4).toString('hex')).toBe('00010000');
      expect(readFileSync(file.replace(/\.ttf$/, '.woff2')).subarray(0, 4).toString('latin1')).toBe('wOF2');
    }
    const pdf = await quotePdf(input);
    const raw = pdf.toString('latin1');
    expect(raw.startsWith('%PDF-')).toBe(true);
    // a subset's BaseFont is a six-letter tag, '+', and the font's PostScript name (ISO 32000-1 §9.6.4)
    const names = [...raw.matchAll(/\/BaseFont \/([A-Z]{6}\+[A-Za-z-]+)/g)].map((m) => m[1]!.slice(7));
    expect(new Set(names)).toEqual(new Set(['AtkinsonHyperlegible-Regular', 'AtkinsonHyperlegible-Bold']));
    expect(raw.match(/\/FontFile2\b/g)).toHaveLength(2);
    expect(raw).not.toMatch(/\/BaseFont \/Helvetica/);
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
