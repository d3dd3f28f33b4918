import 'server-only';
// Quotes of a shop: the bases a job's quote can be built from (its done estimates with the
// machine, material and shop figures), creating a numbered quote with frozen inputs and
// figures, reading, sending (PDF + mail, logged in mail_log), revoking, and the customer's
// answer by token. Every function takes the shop id, except the token ones, which find the
// shop from the token's hash.
import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, inArray, isNull, lt, notInArray, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { customers, estimates, jobEvents, jobs, machines, mailLog, materials, programs, quoteCounters, quotes, shops, type QuoteRow } from '@/db/schema';
import { getShopSettings } from '@/db/queries/shop-settings';
import { listJobPrograms } from '@/db/queries/programs';
import { openEstimateReport } from '@/db/queries/estimates';
import { AppError } from '@/lib/errors';
import { buildPrice, PriceInputError, type PriceFigures, type PriceInputs, type PriceLine, type PriceSettings } from '@/lib/quotes/price';
import type { HoldDown, JobStatus, QuoteStatus } from '@/lib/validation/enums';
import type { QuoteInput } from '@/lib/validation/quotes';

/** One estimate a quote can be built from, with the figures it would freeze. */
export interface QuoteBasis {
  estimateId: number;
  programName: string;
  programVersion: number;
  machineVersion: number;
  figures: PriceFigures;
  defaults: { quantity: number; partsPerSheet: number; holdDown: HoldDown };
}

export interface QuoteView {
  id: number;
  jobId: number;
  estimateId: number;
  number: string;
  revisionOf: number | null;
  status: QuoteStatus;
  currency: string;
  totalMinor: number;
  lines: PriceLine[];
  inputs: PriceInputs;
  figures: PriceFigures;
  validityDays: number;
  validUntil: string | null;
  sentAt: string | null;
  answeredAt: string | null;
  answerName: string | null;
  answerPo: string | null;
  declineReason: string | null;
  linkRevoked: boolean;
  createdAt: string;
  /** the latest message sent for this quote */
  lastMail: { status: string; toAddress: string; error: string | null; createdAt: string } | null;
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function quoteView(row: QuoteRow, lastMail: QuoteView['lastMail'] = null): QuoteView {
  return {
    id: row.id,
    jobId: row.jobId,
    estimateId: row.estimateId,
    number: row.number,
    revisionOf: row.revisionOf,
    status: row.status,
    currency: row.currency,
    totalMinor: row.totalMinor,
    lines: row.lines as PriceLine[],
    inputs: row.inputs as unknown as PriceInputs,
    figures: row.figures as unknown as PriceFigures,
    validityDays: row.validityDays,
    validUntil: row.validUntil,
    sentAt: iso(row.sentAt),
    answeredAt: iso(row.answeredAt),
    answerName: row.answerName,
    answerPo: row.answerPo,
    declineReason: row.declineReason,
    linkRevoked: row.tokenRevokedAt !== null,
    createdAt: row.createdAt.toISOString(),
    lastMail,
  };
}

/** The price settings a quote freezes, from the shop's settings row. */
function priceSettings(s: Awaited<ReturnType<typeof getShopSettings>>): PriceSettings {
  return {
    setupS: s.setupS,
    loadUnloadSPerSheet: s.loadUnloadSPerSheet,
    wasteAllowanceBp: s.wasteAllowanceBp,
    marginBp: s.marginBp,
    taxBp: s.taxBp,
    roundToMinor: s.roundToMinor,
    roundingMode: s.roundingMode,
    labourRateMinorPerHour: s.labourRateMinorPerHour,
    tapeGlueSPerPart: s.tapeGlueSPerPart,
    tabSPerTab: s.tabSPerTab,
    skinSPerPart: s.skinSPerPart,
    clampsSPerSheet: s.clampsSPerSheet,
    tapeCostMinorPerM2: s.tapeCostMinorPerM2,
    glueCostMinorPerPart: s.glueCostMinorPerPart,
  };
}

interface PartsSummary {
  partCount: number;
  tabCount: number;
  areaMm2: number;
  /** the method holding most parts when the job named none */
  heldBy: HoldDown | null;
}

// Reports never change once stored, so their parts summary is kept per estimate id.
const partsCache = new Map<number, PartsSummary>();

async function partsSummary(estimate: { id: number; reportKey: string | null }): Promise<PartsSummary> {
  const hit = partsCache.get(estimate.id);
  if (hit) return hit;
  const stream = await openEstimateReport(estimate);
  if (!stream) throw new AppError('internal', `The report of estimate ${estimate.id} is missing from storage.`);
  const report = JSON.parse(await new Response(stream.body).text()) as { parts?: Array<{ areaMm2?: number; tabs?: number; holdBy?: string }> };
  const parts = report.parts ?? [];
  const byTabs = parts.filter((p) => p.holdBy === 'tabs').length;
  const bySkin = parts.filter((p) => p.holdBy === 'skin').length;
  const summary: PartsSummary = {
    partCount: parts.length,
    tabCount: parts.reduce((n, p) => n + (p.tabs ?? 0), 0),
    areaMm2: parts.reduce((a, p) => a + (p.areaMm2 ?? 0), 0),
    heldBy: byTabs === 0 && bySkin === 0 ? null : byTabs >= bySkin ? 'tabs' : 'skin',
  };
  if (partsCache.size > 500) partsCache.clear();
  partsCache.set(estimate.id, summary);
  return summary;
}

/** other finished estimates offered beside the latest of each program, newest first */
const MORE_BASES = 24;

/**
 * The job's done estimates with the figures a quote would use; null for no such job. First the
 * latest of each program (the builder's default), then the job's other finished estimates,
 * newest first (an earlier program version, another machine or machine version), so the
 * estimator picks the program version × machine version the quote is built on.
 */
export async function quoteBases(shopId: number, jobId: number): Promise<QuoteBasis[] | null> {
  const [job] = await db
    .select({ job: jobs, shopCurrency: shops.currency, material: materials })
    .from(jobs)
    .innerJoin(shops, eq(shops.id, jobs.shopId))
    .leftJoin(materials, and(eq(materials.id, jobs.materialId), eq(materials.shopId, shopId)))
    .where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)))
    .limit(1);
  if (!job) return null;
  const programsOfJob = await listJobPrograms(shopId, jobId);
  const done = (programsOfJob ?? []).filter((p) => p.latest.estimate?.status === 'done');
  const latestIds = done.map((p) => p.latest.estimate!.id);
  const others = await db
    .select({ id: estimates.id })
    .from(estimates)
    .innerJoin(programs, and(eq(programs.id, estimates.programId), eq(programs.shopId, shopId), eq(programs.jobId, jobId)))
    .where(and(eq(estimates.shopId, shopId), eq(estimates.status, 'done'), latestIds.length > 0 ? notInArray(estimates.id, latestIds) : undefined))
    .orderBy(desc(estimates.id))
    .limit(MORE_BASES);
  const ids = [...latestIds, ...others.map((o) => o.id)];
  if (ids.length === 0) return [];
  const settings = priceSettings(await getShopSettings(shopId));
  const rows = await db
    .select({ estimate: estimates, machineName: machines.name, rate: machines.hourlyRateMinor, programName: programs.name })
    .from(estimates)
    .innerJoin(machines, and(eq(machines.id, estimates.machineId), eq(machines.shopId, shopId)))
    // no job condition here: a program's latest estimate may be a row first made for the same
    // bytes and settings in another job (the input key does not name the job)
    .innerJoin(programs, and(eq(programs.id, estimates.programId), eq(programs.shopId, shopId)))
    .where(and(eq(estimates.shopId, shopId), eq(estimates.status, 'done'), inArray(estimates.id, ids)));
  const out: QuoteBasis[] = [];
  for (const id of ids) {
    const row = rows.find((r) => r.estimate.id === id);
    if (!row) continue;
    const e = row.estimate;
    const parts = await partsSummary(e);
    out.push({
      estimateId: e.id,
      programName: done.find((p) => p.latest.estimate!.id === id)?.name ?? row.programName,
      programVersion: e.programVersion,
      machineVersion: e.machineVersion,
      figures: {
        estimateId: e.id,
        secondsPerSheet: e.calibratedSeconds ?? e.totalSeconds ?? 0,
        estimatePartCount: parts.partCount,
        estimateTabCount: parts.tabCount,
        estimatePartsAreaMm2: Math.round(parts.areaMm2),
        machineName: row.machineName,
        machineRateMinorPerHour: row.rate,
        materialName: job.material?.name ?? 'material not set on the job',
        materialCostMinorPerSheet: job.material?.costPerSheetMinor ?? 0,
        currency: job.shopCurrency,
        settings,
      },
      defaults: {
        quantity: job.job.quantity,
        partsPerSheet: Math.max(1, parts.partCount),
        holdDown: e.settings.hold ?? parts.heldBy ?? job.job.holdDown,
      },
    });
  }
  return out;
}

const hashToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

/** Sent quotes past their validity become expired (the day after valid_until). */
async function expireDue(shopId: number): Promise<void> {
  await db
    .update(quotes)
    .set({ status: 'expired' })
    .where(and(eq(quotes.shopId, shopId), eq(quotes.status, 'sent'), lt(quotes.validUntil, sql`CURRENT_DATE()`)));
}

async function lastMails(shopId: number, quoteIds: number[]): Promise<Map<number, QuoteView['lastMail']>> {
  const out = new Map<number, QuoteView['lastMail']>();
  if (quoteIds.length === 0) return out;
  const rows = await db
    .select()
    .from(mailLog)
    .where(and(eq(mailLog.shopId, shopId), inArray(mailLog.quoteId, quoteIds)))
    .orderBy(desc(mailLog.id));
  for (const r of rows) {
    if (r.quoteId !== null && !out.has(r.quoteId)) out.set(r.quoteId, { status: r.status, toAddress: r.toAddress, error: r.error, createdAt: r.createdAt.toISOString() });
  }
  return out;
}

export async function listJobQuotes(shopId: number, jobId: number): Promise<QuoteView[]> {
  await expireDue(shopId);
  const rows = await db
    .select()
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), eq(quotes.jobId, jobId)))
    .orderBy(desc(quotes.id));
  const mails = await lastMails(shopId, rows.map((r) => r.id));
  return rows.map((r) => quoteView(r, mails.get(r.id) ?? null));
}

export async function getQuoteRow(shopId: number, quoteId: number): Promise<QuoteRow | null> {
  await expireDue(shopId);
  const [row] = await db.select().from(quotes).where(and(eq(quotes.shopId, shopId), eq(quotes.id, quoteId))).limit(1);
  return row ?? null;
}

export async function getQuote(shopId: number, quoteId: number): Promise<QuoteView | null> {
  const row = await getQuoteRow(shopId, quoteId);
  if (!row) return null;
  return quoteView(row, (await lastMails(shopId, [row.id])).get(row.id) ?? null);
}

/** Q-2026-0001: the shop's own sequence per year. */
export function quoteNumber(year: number, n: number): string {
  return `Q-${year}-${String(n).padStart(4, '0')}`;
}

/**
 * A new draft quote from one of the job's bases. The number comes from quote_counters: the
 * row is made first on its own (INSERT IGNORE, autocommit, so no shared lock is held), then
 * read FOR UPDATE and bumped inside the transaction that inserts the quote, so concurrent
 * creations queue on the row lock and take consecutive numbers; a failed insert rolls the
 * bump back with it, so no number is skipped.
 */
export async function createQuote(shopId: number, userId: number, jobId: number, input: QuoteInput): Promise<QuoteView> {
  const bases = await quoteBases(shopId, jobId);
  if (!bases) throw new AppError('not-found:job', 'No such job.');
  const basis = bases.find((b) => b.estimateId === input.estimateId);
  if (!basis) {
    throw new AppError('invalid:quote', 'Choose one of the job’s finished estimates.', { estimateId: ['This estimate is not a finished estimate of this job.'] });
  }
  const inputs: PriceInputs = { quantity: input.quantity, partsPerSheet: input.partsPerSheet, holdDown: input.holdDown, extraLines: input.extraLines };
  let price;
  try {
    price = buildPrice(inputs, basis.figures);
  } catch (err) {
    if (err instanceof PriceInputError) throw new AppError('invalid:quote', 'Some of the quote details need fixing.', { [err.field]: [err.message] });
    throw err;
  }
  if (input.revisionOf !== undefined) {
    const [old] = await db.select({ id: quotes.id }).from(quotes).where(and(eq(quotes.shopId, shopId), eq(quotes.id, input.revisionOf), eq(quotes.jobId, jobId))).limit(1);
    if (!old) throw new AppError('invalid:quote', 'The quote revised must be one of this job’s quotes.', { revisionOf: ['No such quote on this job.'] });
  }
  const shopSettingsRow = await getShopSettings(shopId);
  const year = new Date().getUTCFullYear();
  await db.insert(quoteCounters).ignore().values({ shopId, year, next: 1 });
  const id = await db.transaction(async (tx) => {
    const [counter] = await tx
      .select({ next: quoteCounters.next })
      .from(quoteCounters)
      .where(and(eq(quoteCounters.shopId, shopId), eq(quoteCounters.year, year)))
      .for('update');
    if (!counter) throw new Error(`quote counter of shop ${shopId} for ${year} is missing`);
    await tx
      .update(quoteCounters)
      .set({ next: counter.next + 1 })
      .where(and(eq(quoteCounters.shopId, shopId), eq(quoteCounters.year, year)));
    const number = quoteNumber(year, counter.next);
    const [result] = await tx.insert(quotes).values({
      shopId,
      jobId,
      estimateId: basis.estimateId,
      number,
      revisionOf: input.revisionOf ?? null,
      status: 'draft',
      currency: basis.figures.currency,
      totalMinor: price.totalMinor,
      inputs: inputs as unknown as Record<string, unknown>,
      figures: basis.figures as unknown as Record<string, unknown>,
      lines: price.lines,
      validityDays: shopSettingsRow.quoteValidityDays,
      createdBy: userId,
    });
    await tx.insert(jobEvents).values({
      shopId,
      jobId,
      userId,
      kind: 'quote-created',
      detail: `Drafted quote ${number}${input.revisionOf ? ' (a revision)' : ''}.`,
    });
    return result.insertId;
  });
  const made = await getQuote(shopId, id);
  if (!made) throw new Error(`quote ${id} vanished after insert`);
  return made;
}

export interface QuoteContext {
  shopName: string;
  shopAddress: string;
  quoteTerms: string;
  jobTitle: string;
  customerName: string;
  customerEmail: string;
}

export async function quoteContext(shopId: number, jobId: number): Promise<QuoteContext> {
  const [row] = await db
    .select({ shopName: shops.name, jobTitle: jobs.title, customerName: customers.name, customerEmail: customers.email })
    .from(jobs)
    .innerJoin(shops, eq(shops.id, jobs.shopId))
    .innerJoin(customers, and(eq(customers.id, jobs.customerId), eq(customers.shopId, shopId)))
    .where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)))
    .limit(1);
  if (!row) throw new AppError('not-found:job', 'No such job.');
  const s = await getShopSettings(shopId);
  return { ...row, shopAddress: s.address, quoteTerms: s.quoteTerms };
}

/** A fresh customer token (128 random bits, URL-safe) and its stored hash. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(16).toString('base64url');
  return { token, hash: hashToken(token) };
}

export async function logMail(row: { shopId: number; quoteId: number; toAddress: string; subject: string; sentBy: number }): Promise<number> {
  const [r] = await db.insert(mailLog).values({ ...row, status: 'sending' });
  return r.insertId;
}

export async function finishMailLog(id: number, outcome: { ok: true; messageId: string } | { ok: false; error: string }): Promise<void> {
  await db
    .update(mailLog)
    .set(outcome.ok ? { status: 'sent', messageId: outcome.messageId.slice(0, 255) } : { status: 'failed', error: outcome.error.slice(0, 1000) })
    .where(eq(mailLog.id, id));
}

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/** Moves the job to `to` when it is in one of `from`, with the history line naming the status it left. */
async function moveJob(tx: Tx, shopId: number, jobId: number, userId: number | null, from: JobStatus[], to: JobStatus): Promise<void> {
  const [job] = await tx.select({ status: jobs.status }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId))).for('update');
  if (!job || !from.includes(job.status)) return;
  await tx.update(jobs).set({ status: to }).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
  await tx.insert(jobEvents).values({ shopId, jobId, userId, kind: 'status', detail: `${job.status}>${to}` });
}

/**
 * Marks a draft sent after the SMTP server accepted it: the token's hash, the sent time and
 * the validity date; the job moves from programmed to quoted. A quote sent meanwhile by
 * someone else is refused (the UPDATE repeats the draft status).
 */
export async function markQuoteSent(shopId: number, userId: number, quote: QuoteRow, tokenHash: string): Promise<void> {
  await db.transaction(async (tx) => {
    const [r] = await tx
      .update(quotes)
      .set({ status: 'sent', tokenHash, sentAt: sql`NOW()`, tokenRevokedAt: null, validUntil: sql`DATE_ADD(CURRENT_DATE(), INTERVAL ${quote.validityDays} DAY)` })
      .where(and(eq(quotes.shopId, shopId), eq(quotes.id, quote.id), eq(quotes.status, 'draft')));
    if (r.affectedRows !== 1) throw new AppError('conflict:quote-status', 'This quote is no longer a draft. Reload the page.');
    // an older quote this one revises no longer takes an answer
    if (quote.revisionOf !== null) {
      await tx.update(quotes).set({ tokenRevokedAt: sql`NOW()` }).where(and(eq(quotes.shopId, shopId), eq(quotes.id, quote.revisionOf), isNull(quotes.tokenRevokedAt)));
    }
    await tx.insert(jobEvents).values({ shopId, jobId: quote.jobId, userId, kind: 'quote-sent', detail: `Sent quote ${quote.number} to the customer.` });
    await moveJob(tx, shopId, quote.jobId, userId, ['draft', 'programmed'], 'quoted');
  });
}

export async function revokeQuoteLink(shopId: number, userId: number, quoteId: number): Promise<QuoteView> {
  const row = await getQuoteRow(shopId, quoteId);
  if (!row) throw new AppError('not-found:quote', 'No such quote.');
  if (row.status !== 'sent') throw new AppError('conflict:quote-status', 'Only a sent quote’s link can be withdrawn.');
  await db.transaction(async (tx) => {
    await tx.update(quotes).set({ tokenRevokedAt: sql`NOW()` }).where(and(eq(quotes.id, row.id), isNull(quotes.tokenRevokedAt)));
    await tx.insert(jobEvents).values({ shopId, jobId: row.jobId, userId, kind: 'quote-revoked', detail: `Withdrew the customer link of quote ${row.number}.` });
  });
  return (await getQuote(shopId, quoteId))!;
}

/** What the customer's page may show: this quote and the shop's name and address, nothing else. */
export interface CustomerQuote {
  state: 'open' | 'accepted' | 'declined' | 'expired' | 'revoked';
  number: string;
  currency: string;
  totalMinor: number;
  lines: PriceLine[];
  validUntil: string | null;
  shopName: string;
  shopAddress: string;
  quoteTerms: string;
  jobTitle: string;
  customerName: string;
  answerName: string | null;
}

export type TokenLookup = { found: false } | { found: true; quote: CustomerQuote; row: QuoteRow };

export async function quoteByToken(token: string): Promise<TokenLookup> {
  if (!/^[A-Za-z0-9_-]{16,64}$/.test(token)) return { found: false };
  const [hit] = await db.select().from(quotes).where(eq(quotes.tokenHash, hashToken(token))).limit(1);
  if (!hit) return { found: false };
  await expireDue(hit.shopId);
  const [row] = await db.select().from(quotes).where(eq(quotes.id, hit.id)).limit(1);
  if (!row) return { found: false };
  const ctx = await quoteContext(row.shopId, row.jobId);
  const state: CustomerQuote['state'] =
    row.status === 'accepted' ? 'accepted' : row.status === 'declined' ? 'declined' : row.status === 'expired' ? 'expired' : row.tokenRevokedAt ? 'revoked' : 'open';
  return {
    found: true,
    row,
    quote: {
      state,
      number: row.number,
      currency: row.currency,
      totalMinor: row.totalMinor,
      lines: row.lines as PriceLine[],
      validUntil: row.validUntil,
      shopName: ctx.shopName,
      shopAddress: ctx.shopAddress,
      quoteTerms: ctx.quoteTerms,
      jobTitle: ctx.jobTitle,
      customerName: ctx.customerName,
      answerName: row.answerName,
    },
  };
}

export type CustomerAnswer = { kind: 'accept'; name: string; purchaseOrder?: string } | { kind: 'decline'; reason?: string };

/**
 * The customer's one answer. The UPDATE names every condition (sent, link unused and not
 * withdrawn, still valid), so a second answer, a withdrawn link or an expired quote changes
 * nothing; an acceptance moves the job from quoted to accepted in the same transaction.
 */
export async function answerQuote(token: string, answer: CustomerAnswer): Promise<{ ok: true } | { ok: false; why: CustomerQuote['state'] | 'unknown' }> {
  const found = await quoteByToken(token);
  if (!found.found) return { ok: false, why: 'unknown' };
  if (found.quote.state !== 'open') return { ok: false, why: found.quote.state };
  const row = found.row;
  return db.transaction(async (tx) => {
    const [r] = await tx
      .update(quotes)
      .set(
        answer.kind === 'accept'
          ? { status: 'accepted', tokenUsedAt: sql`NOW()`, answeredAt: sql`NOW()`, answerName: answer.name, answerPo: answer.purchaseOrder || null }
          : { status: 'declined', tokenUsedAt: sql`NOW()`, answeredAt: sql`NOW()`, declineReason: answer.reason || null },
      )
      .where(
        and(
          eq(quotes.id, row.id),
          eq(quotes.status, 'sent'),
          isNull(quotes.tokenUsedAt),
          isNull(quotes.tokenRevokedAt),
          sql`${quotes.validUntil} >= CURRENT_DATE()`,
        ),
      );
    // someone answered (or the shop withdrew the link) between the read and this write
    if (r.affectedRows !== 1) return { ok: false as const, why: 'unknown' as const };
    const words =
      answer.kind === 'accept'
        ? `The customer (${answer.name}${answer.purchaseOrder ? `, order ${answer.purchaseOrder}` : ''}) accepted quote ${row.number}.`
        : `The customer declined quote ${row.number}${answer.reason ? `: ${answer.reason}` : ''}.`;
    await tx.insert(jobEvents).values({ shopId: row.shopId, jobId: row.jobId, userId: null, kind: answer.kind === 'accept' ? 'quote-accepted' : 'quote-declined', detail: words.slice(0, 500) });
    if (answer.kind === 'accept') {
      await moveJob(tx, row.shopId, row.jobId, null, ['programmed', 'quoted'], 'accepted');
    }
    return { ok: true as const };
  });
}

