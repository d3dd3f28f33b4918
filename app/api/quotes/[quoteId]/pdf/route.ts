// GET /api/quotes/:quoteId/pdf: the quote document as a PDF download.
import { NextResponse } from 'next/server';
import { getQuoteRow } from '@/db/queries/quotes';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle } from '@/lib/http/route';
import { pdfForQuote } from '@/lib/mail/quote-mail';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ quoteId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('quotes:read');
  const row = await getQuoteRow(user.shopId, parseId((await params).quoteId, 'quote'));
  if (!row) throw new AppError('not-found:quote', 'No such quote.');
  const pdf = await pdfForQuote(user.shopId, row);
  return new NextResponse(new Uint8Array(pdf), {
    status: 200,
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `attachment; filename="${row.number}.pdf"`,
      'content-length': String(pdf.byteLength),
      'cache-control': 'no-store',
    },
  });
});
