// One spec per route handler and per server action: the action of lib/auth/roles.ts it must
// ask for (taken from the route's own header comment and DEVELOPERS.md's "every route handler
// and server action starts with requireRole"), a valid input that reaches the data, and for
// handlers that read a body the bad inputs of tests/unit/http/bad-input.test.ts.
// tests/unit/auth/route-guards.test.ts finds the route and action files on disk and fails for
// any exported handler or action without a spec here, so a new route needs one.
//
// Boundary values are the schemas' stated limits (lib/validation/*): sheet lengths up to
// 6000 mm, titles and names to 160/120 characters, e-mail to 190 characters (RFC 5321 §4.5.3.1
// allows longer addresses; 190 is the column's limit), quantity to 100,000, a vacuum level
// above 0 and at most one atmosphere (101.325 kPa, ISO 2533's standard atmosphere), and no
// non-finite number ("Infinity" coerces to a number, which must be refused).
import readFixture from '@/fixtures/machines/router-1.json';
import type { Action } from '@/lib/auth/roles';
import type { Answers } from './handlers';

/** any signed-in role, also one who must still replace a one-time password */
export const OWN_PASSWORD = 'own-password' as const;
/** no sign-in at all: a customer's tokenised link (the token is the key) */
export const PUBLIC = 'public' as const;

export interface Boundary {
  label: string;
  body?: unknown;
  /** the body as sent, for what JSON.stringify cannot write (1e400 parses as Infinity) */
  raw?: string;
  /** true: the value is inside the limit and reaches the data; a field name: refused there (422) */
  expect: true | string;
}

export interface BodyChecks {
  /** a body of the right keys with values of the wrong types, and the fields it must name */
  wrongTypes: { body: unknown; fields: string[] };
  boundaries?: Boundary[];
}

export interface RouteSpec {
  action: Action | typeof OWN_PASSWORD | typeof PUBLIC;
  /** for a PUBLIC route: why no role guards it */
  publicBecause?: string;
  /** params of the route's [segments]; each defaults to '5' */
  params?: Record<string, string>;
  query?: string;
  body?: unknown;
  /** the status of a call that is allowed and succeeds */
  status?: number;
  answers?: Answers;
  /** why the handler's own guard is not the whole rule */
  note?: string;
  /** checks of a JSON body (handlers that read one) */
  input?: BodyChecks;
  /** the handler does not read JSON (a multipart upload): where its bad input is tested */
  inputElsewhere?: string;
  /** bad query strings of a list route: each answers 422 naming the field */
  badQueries?: { query: string; field: string }[];
}

export interface ActionSpec {
  action: Action | typeof OWN_PASSWORD;
  form: Record<string, string>;
  answers?: Answers;
}

const { tools: _tools, ...profile } = readFixture as typeof readFixture;
void _tools;

const chars = (n: number) => 'x'.repeat(n);
/** an e-mail address of exactly n characters */
const emailOf = (n: number) => `${'a'.repeat(n - '@alder-finch.example'.length)}@alder-finch.example`;

const job = {
  title: 'Shelf brackets, 18 mm birch',
  customerId: 3,
  sheetWidthMm: 1220,
  sheetLengthMm: 2440,
  sheetThicknessMm: 18,
  holdDown: 'vacuum',
  vacuumKpa: 60,
  quantity: 40,
};

const jobChecks: BodyChecks = {
  wrongTypes: { body: { ...job, title: 42, customerId: 'Marlow', sheetWidthMm: 'wide', quantity: 'many', holdDown: 7 }, fields: ['customerId', 'holdDown', 'quantity', 'sheetWidthMm', 'title'] },
  boundaries: [
    { label: 'a 6000 mm sheet', body: { ...job, sheetWidthMm: 6000, sheetLengthMm: 6000 }, expect: true },
    { label: 'a 6000.5 mm sheet', body: { ...job, sheetLengthMm: 6000.5 }, expect: 'sheetLengthMm' },
    { label: 'a 160-character title', body: { ...job, title: chars(160) }, expect: true },
    { label: 'a 161-character title', body: { ...job, title: chars(161) }, expect: 'title' },
    { label: 'a 190-character title', body: { ...job, title: chars(190) }, expect: 'title' },
    { label: 'quantity 100,000', body: { ...job, quantity: 100_000 }, expect: true },
    { label: 'quantity 100,001', body: { ...job, quantity: 100_001 }, expect: 'quantity' },
    { label: 'vacuum 0 kPa', body: { ...job, vacuumKpa: 0 }, expect: 'vacuumKpa' },
    { label: 'vacuum 101.325 kPa (one atmosphere)', body: { ...job, vacuumKpa: 101.325 }, expect: true },
    { label: 'sheet width "Infinity"', body: { ...job, sheetWidthMm: 'Infinity' }, expect: 'sheetWidthMm' },
    { label: 'quantity "Infinity"', body: { ...job, quantity: 'Infinity' }, expect: 'quantity' },
    { label: 'vacuum "Infinity"', body: { ...job, vacuumKpa: 'Infinity' }, expect: 'vacuumKpa' },
    { label: 'quantity 1e400 (JSON.parse makes it Infinity)', raw: JSON.stringify(job).replace('"quantity":40', '"quantity":1e400'), expect: 'quantity' },
    { label: 'sheet width -1e400', raw: JSON.stringify(job).replace('"sheetWidthMm":1220', '"sheetWidthMm":-1e400'), expect: 'sheetWidthMm' },
  ],
};

const customer = { name: 'Marlow Street Bakery', email: 'orders@marlow-street-bakery.example' };
const customerBoundaries: Boundary[] = [
  { label: 'a 160-character name', body: { ...customer, name: chars(160) }, expect: true },
  { label: 'a 161-character name', body: { ...customer, name: chars(161) }, expect: 'name' },
  { label: 'a 190-character e-mail', body: { ...customer, email: emailOf(190) }, expect: true },
  { label: 'a 191-character e-mail', body: { ...customer, email: emailOf(191) }, expect: 'email' },
];

const material = { name: '18 mm birch plywood', thicknessMm: 18, sheetWidthMm: 1220, sheetLengthMm: 2440, costPerSheetMinor: 6400 };
const materialBoundaries: Boundary[] = [
  { label: 'a 6000 mm sheet', body: { ...material, sheetWidthMm: 6000, sheetLengthMm: 6000 }, expect: true },
  { label: 'a 6001 mm sheet', body: { ...material, sheetWidthMm: 6001 }, expect: 'sheetWidthMm' },
  { label: 'a 160-character name', body: { ...material, name: chars(160) }, expect: 'name' },
  { label: 'thickness "Infinity"', body: { ...material, thicknessMm: 'Infinity' }, expect: 'thicknessMm' },
  { label: 'a cost of 12.5 minor units (money is whole minor units)', body: { ...material, costPerSheetMinor: 12.5 }, expect: 'costPerSheetMinor' },
];

const machine = { ...profile, hourlyRateMinor: 8500, defaultHoldDown: 'vacuum', defaultVacuumKpa: 60 };
const tool = { number: 5, diameterMm: 6, flutes: 2, kind: 'upcut', description: 'spare 6 mm up-cut' };

const quote = { estimateId: 21, quantity: 400, partsPerSheet: 24, holdDown: 'vacuum', extraLines: [{ label: 'Edge polishing', amountMinor: 4500 }] };
const shopSettings = {
  address: '4 Kiln Yard, Easton', quoteTerms: 'Payment within 30 days.', quoteValidityDays: 30, setupS: 900, loadUnloadSPerSheet: 120,
  wasteAllowanceBp: 500, marginBp: 2500, taxBp: 2000, roundToMinor: 100, roundingMode: 'nearest', labourRateMinorPerHour: 3200,
  tapeGlueSPerPart: 20, tabSPerTab: 8, skinSPerPart: 30, clampsSPerSheet: 90, tapeCostMinorPerM2: 150, glueCostMinorPerPart: 3,
  calibrationRuns: 10, calibrationMinRuns: 3,
};

const user = { name: 'Ines Ward', email: 'ines@alder-finch.example', role: 'operator', password: 'a long pass phrase 7' };
const password = { currentPassword: 'kerfcast-demo', newPassword: 'a new pass phrase 9', repeatPassword: 'a new pass phrase 9' };

/**
 * Route files outside app/api (a page's own route handler, e.g. a public quote link's PDF):
 * not guarded by a role by design, each with the reason; any other one fails discovery.
 */
export const ROUTES_OUTSIDE_API: Record<string, string> = {};

export const ROUTE_SPECS: Record<string, RouteSpec> = {
  'GET /api/customers': { action: 'customers:read' },
  'POST /api/customers': {
    action: 'customers:write',
    body: customer,
    status: 201,
    input: { wrongTypes: { body: { name: 5, email: false, phone: 12 }, fields: ['email', 'name', 'phone'] }, boundaries: customerBoundaries },
  },
  'GET /api/customers/[customerId]': { action: 'customers:read' },
  'PATCH /api/customers/[customerId]': {
    action: 'customers:write',
    body: { name: 'Marlow Street Bakery Ltd' },
    input: { wrongTypes: { body: { name: [], notes: 3 }, fields: ['name', 'notes'] }, boundaries: customerBoundaries },
  },
  'GET /api/estimates/[estimateId]': { action: 'estimates:read' },
  'GET /api/estimates/[estimateId]/hold-down': { action: 'holddown:read', query: '?ruleOut=tape-glue', badQueries: [{ query: '?ruleOut=glue', field: 'ruleOut' }] },
  'GET /api/jobs': {
    action: 'jobs:read',
    query: '?sort=due&perPage=50',
    badQueries: [
      { query: '?sort=colour', field: 'sort' },
      { query: '?perPage=30', field: 'perPage' },
      { query: '?page=Infinity', field: 'page' },
      { query: `?q=${chars(101)}`, field: 'q' },
    ],
  },
  'POST /api/jobs': { action: 'jobs:write', body: job, status: 201, input: jobChecks },
  'GET /api/jobs/[jobId]': { action: 'jobs:read' },
  'PUT /api/jobs/[jobId]': { action: 'jobs:write', body: job, input: jobChecks },
  'PATCH /api/jobs/[jobId]': {
    action: 'jobs:read',
    body: { status: 'cancelled' },
    note: 'the step itself (cancel, quote, run…) is checked in moveJobStatus against lib/jobs/status-moves.ts: tests/unit/jobs/status-moves.test.ts and the integration sweep',
    input: { wrongTypes: { body: { status: 3 }, fields: ['status'] }, boundaries: [{ label: 'a status that does not exist', body: { status: 'shipped' }, expect: 'status' }] },
  },
  'GET /api/jobs/[jobId]/events': { action: 'jobs:read' },
  'GET /api/jobs/[jobId]/programs': { action: 'programs:read' },
  'POST /api/jobs/[jobId]/programs': {
    action: 'programs:write',
    status: 201,
    answers: { receivePrograms: { programs: [], objectKeys: [] }, recordUploadedPrograms: { programs: [], queued: false } },
    inputElsewhere: 'a multipart upload, not JSON: refused files (name, empty, binary, size) in tests/integration/programs-upload.test.ts',
  },
  'GET /api/machines': { action: 'machines:read', query: '?archived=include', badQueries: [{ query: '?archived=some', field: 'archived' }] },
  'POST /api/machines': {
    action: 'machines:write',
    body: machine,
    status: 201,
    input: {
      wrongTypes: { body: { ...machine, name: 9, travelMm: 'big', lookaheadBlocks: 'sixty', hourlyRateMinor: '85' }, fields: ['hourlyRateMinor', 'lookaheadBlocks', 'name', 'travelMm'] },
      boundaries: [
        { label: 'vacuum 0 kPa', body: { ...machine, defaultVacuumKpa: 0 }, expect: 'defaultVacuumKpa' },
        { label: 'a 120-character name', body: { ...machine, name: chars(120) }, expect: true },
        { label: 'a 160-character name', body: { ...machine, name: chars(160) }, expect: 'name' },
        { label: 'feed "Infinity"', body: { ...machine, maxFeedMmPerMin: { x: 'Infinity', y: 30000, z: 10000 } }, expect: 'maxFeedMmPerMin.x' },
        { label: 'an hourly rate of 85.5 minor units', body: { ...machine, hourlyRateMinor: 85.5 }, expect: 'hourlyRateMinor' },
      ],
    },
  },
  'GET /api/machines/[machineId]': { action: 'machines:read', answers: { listMachineVersions: [] } },
  'PATCH /api/machines/[machineId]': {
    action: 'machines:write',
    body: { cornerToleranceMm: 0.03 },
    input: {
      wrongTypes: { body: { cornerToleranceMm: '0.03', archived: 'yes' }, fields: ['archived', 'cornerToleranceMm'] },
      boundaries: [
        { label: 'vacuum 0 kPa', body: { defaultVacuumKpa: 0 }, expect: 'defaultVacuumKpa' },
        { label: 'vacuum null (no vacuum table)', body: { defaultVacuumKpa: null }, expect: true },
        { label: 'a key that is not a profile field', body: { colour: 'green' }, expect: '_form' },
      ],
    },
  },
  'DELETE /api/machines/[machineId]': { action: 'machines:write', answers: { removeMachine: 'archived' } },
  'GET /api/machines/[machineId]/tools': { action: 'machines:read' },
  'POST /api/machines/[machineId]/tools': {
    action: 'machines:write',
    body: tool,
    status: 201,
    input: {
      wrongTypes: { body: { number: '5', diameterMm: 'six', flutes: 2.5, kind: 'spiral' }, fields: ['diameterMm', 'flutes', 'kind', 'number'] },
      boundaries: [
        { label: 'a 160-character description', body: { ...tool, description: chars(160) }, expect: true },
        { label: 'a 161-character description', body: { ...tool, description: chars(161) }, expect: 'description' },
        { label: 'diameter "Infinity"', body: { ...tool, diameterMm: 'Infinity' }, expect: 'diameterMm' },
      ],
    },
  },
  'PATCH /api/machines/[machineId]/tools/[toolId]': {
    action: 'machines:write',
    body: { diameterMm: 6.35 },
    input: { wrongTypes: { body: { diameterMm: 'six', flutes: 'two' }, fields: ['diameterMm', 'flutes'] }, boundaries: [{ label: 'a 190-character description', body: { description: chars(190) }, expect: 'description' }] },
  },
  'DELETE /api/machines/[machineId]/tools/[toolId]': { action: 'machines:write' },
  'GET /api/materials': { action: 'materials:read' },
  'POST /api/materials': {
    action: 'materials:write',
    body: material,
    status: 201,
    input: { wrongTypes: { body: { ...material, thicknessMm: 'thick', costPerSheetMinor: 'cheap', name: 1 }, fields: ['costPerSheetMinor', 'name', 'thicknessMm'] }, boundaries: materialBoundaries },
  },
  'GET /api/materials/[materialId]': { action: 'materials:read' },
  'PATCH /api/materials/[materialId]': {
    action: 'materials:write',
    body: { costPerSheetMinor: 6600 },
    input: { wrongTypes: { body: { costPerSheetMinor: 'dear' }, fields: ['costPerSheetMinor'] }, boundaries: materialBoundaries },
  },
  'DELETE /api/materials/[materialId]': { action: 'materials:write' },
  'GET /api/programs/[programId]': { action: 'programs:read' },
  'GET /api/programs/[programId]/estimates': { action: 'estimates:read', answers: { listProgramEstimates: [] } },
  'POST /api/programs/[programId]/estimates': {
    action: 'estimates:write',
    body: { machineId: 2 },
    status: 202,
    input: {
      wrongTypes: { body: { machineId: '2', version: 'latest' }, fields: ['machineId', 'version'] },
      boundaries: [
        { label: 'machine id 2^31 − 1', body: { machineId: 2_147_483_647 }, expect: true },
        { label: 'machine id 2^31', body: { machineId: 2_147_483_648 }, expect: 'machineId' },
        { label: 'version 0', body: { machineId: 2, version: 0 }, expect: 'version' },
      ],
    },
  },
  'GET /api/programs/[programId]/versions/[version]/file': {
    action: 'programs:read',
    params: { programId: '5', version: '1' },
    answers: { openProgramObject: () => ({ body: new Blob(['G0 X0\n']).stream(), bytes: 6 }) },
  },
  'PATCH /api/shop': {
    action: 'shop:write',
    body: { lengthUnit: 'inch' },
    input: { wrongTypes: { body: { lengthUnit: 25.4 }, fields: ['lengthUnit'] }, boundaries: [{ label: 'a unit that is not offered', body: { lengthUnit: 'cubit' }, expect: 'lengthUnit' }] },
  },
  'GET /api/jobs/[jobId]/quotes': { action: 'quotes:read', answers: { listJobQuotes: [] } },
  'POST /api/jobs/[jobId]/quotes': {
    action: 'quotes:write',
    body: quote,
    status: 201,
    input: {
      wrongTypes: { body: { ...quote, estimateId: 'latest', holdDown: 'glue', extraLines: 'none' }, fields: ['estimateId', 'extraLines', 'holdDown'] },
      boundaries: [
        { label: 'quantity 1,000,000', body: { ...quote, quantity: 1_000_000 }, expect: true },
        { label: 'quantity 1,000,001', body: { ...quote, quantity: 1_000_001 }, expect: 'quantity' },
        { label: 'quantity "Infinity"', body: { ...quote, quantity: 'Infinity' }, expect: 'quantity' },
        { label: 'parts per sheet 100,000', body: { ...quote, partsPerSheet: 100_000 }, expect: true },
        { label: 'parts per sheet 0', body: { ...quote, partsPerSheet: 0 }, expect: 'partsPerSheet' },
        { label: 'a 190-character line name', body: { ...quote, extraLines: [{ label: chars(190), amountMinor: 100 }] }, expect: true },
        { label: 'a 201-character line name', body: { ...quote, extraLines: [{ label: chars(201), amountMinor: 100 }] }, expect: 'extraLines.0.label' },
        { label: 'an amount of 12.5 minor units', body: { ...quote, extraLines: [{ label: 'Edge polishing', amountMinor: 12.5 }] }, expect: 'extraLines.0.amountMinor' },
      ],
    },
  },
  'GET /api/quotes/[quoteId]': { action: 'quotes:read' },
  'GET /api/quotes/[quoteId]/pdf': { action: 'quotes:read', answers: { pdfForQuote: Buffer.from('%PDF-1.7\n') } },
  'POST /api/quotes/[quoteId]/revoke': { action: 'quotes:write' },
  'POST /api/quotes/[quoteId]/send': { action: 'quotes:write' },
  'POST /api/q/[token]': {
    action: PUBLIC,
    publicBecause: "the customer's answer to a quote: no account, the link's token is the key (PRODUCT.md: customer, no account)",
    params: { token: 'k'.repeat(43) },
    body: { answer: 'accept', name: 'Marlow Street Bakery, J. Baker' },
    answers: { answerQuote: { ok: true } },
    input: {
      wrongTypes: { body: { answer: 'accept', name: 7, purchaseOrder: 12 }, fields: ['name', 'purchaseOrder'] },
      boundaries: [
        { label: 'an answer that is neither', body: { answer: 'maybe' }, expect: 'answer' },
        { label: 'a 160-character name', body: { answer: 'accept', name: chars(160) }, expect: true },
        { label: 'a 161-character name', body: { answer: 'accept', name: chars(161) }, expect: 'name' },
        { label: 'a 190-character name', body: { answer: 'accept', name: chars(190) }, expect: 'name' },
        { label: 'a 1000-character reason to decline', body: { answer: 'decline', reason: chars(1000) }, expect: true },
      ],
    },
  },
  'GET /api/shop/settings': { action: 'shop:write' },
  'PUT /api/shop/settings': {
    action: 'shop:write',
    body: shopSettings,
    input: {
      wrongTypes: { body: { ...shopSettings, marginBp: 'a quarter', roundingMode: 5 }, fields: ['marginBp', 'roundingMode'] },
      boundaries: [
        { label: 'setup time "Infinity"', body: { ...shopSettings, setupS: 'Infinity' }, expect: 'setupS' },
        { label: 'tax 100 %', body: { ...shopSettings, taxBp: 10_000 }, expect: true },
        { label: 'tax 100.01 %', body: { ...shopSettings, taxBp: 10_001 }, expect: 'taxBp' },
        { label: 'fewer runs than the minimum', body: { ...shopSettings, calibrationRuns: 2, calibrationMinRuns: 3 }, expect: 'calibrationMinRuns' },
        { label: 'a key the settings do not have', body: { ...shopSettings, currency: 'EUR' }, expect: '_form' },
      ],
    },
  },
  // runs (issue 15): limits from lib/validation/runs.ts (7 days of seconds, 1000 sheets, 2000-character notes)
  'GET /api/runs': {
    action: 'runs:read',
    query: '?programId=5&version=2&perPage=50',
    badQueries: [
      { query: '?perPage=30', field: 'perPage' },
      { query: '?status=stopped', field: 'status' },
      { query: '?machineId=two', field: 'machineId' },
      { query: '?from=2026-12', field: 'from' },
    ],
  },
  'POST /api/runs': {
    action: 'runs:write',
    body: { programId: 5, version: 1, machineId: 2 },
    status: 201,
    input: {
      wrongTypes: { body: { programId: '5', version: true, machineId: [2] }, fields: ['machineId', 'programId', 'version'] },
      boundaries: [
        { label: 'machine id 2^31 − 1', body: { programId: 5, version: 1, machineId: 2_147_483_647 }, expect: true },
        { label: 'machine id 2^31', body: { programId: 5, version: 1, machineId: 2_147_483_648 }, expect: 'machineId' },
        { label: 'version 0', body: { programId: 5, version: 0, machineId: 2 }, expect: 'version' },
        { label: 'version 1e400 (Infinity)', raw: '{"programId":5,"version":1e400,"machineId":2}', expect: 'version' },
      ],
    },
  },
  'POST /api/runs/manual': {
    action: 'runs:write',
    body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-12-03T08:30', durationSeconds: 2700, sheetsCut: 3, interrupted: false },
    status: 201,
    input: {
      wrongTypes: {
        body: { programId: 5, version: 1, machineId: 2, startedAt: 20261203, durationSeconds: '45 min', sheetsCut: 'three', interrupted: 'no' },
        fields: ['durationSeconds', 'interrupted', 'sheetsCut', 'startedAt'],
      },
      boundaries: [
        { label: 'a start and an end', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-12-03T08:30:00Z', finishedAt: '2026-12-03T09:15:00Z', sheetsCut: 3 }, expect: true },
        { label: '31 February', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-02-31T08:30', durationSeconds: 60, sheetsCut: 1 }, expect: 'startedAt' },
        { label: 'an end before the start', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-12-03T09:15', finishedAt: '2026-12-03T08:30', sheetsCut: 1 }, expect: 'finishedAt' },
        { label: 'neither end nor duration', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-12-03T08:30', sheetsCut: 1 }, expect: 'durationSeconds' },
        { label: 'both end and duration', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-12-03T08:30', finishedAt: '2026-12-03T09:00', durationSeconds: 1800, sheetsCut: 1 }, expect: 'durationSeconds' },
        { label: '7 days of seconds', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-11-20T08:30', durationSeconds: 604_800, sheetsCut: 1 }, expect: true },
        { label: '7 days and 1 s', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-11-20T08:30', durationSeconds: 604_801, sheetsCut: 1 }, expect: 'durationSeconds' },
        { label: 'a run ending next year', body: { programId: 5, version: 1, machineId: 2, startedAt: '2099-01-04T08:30', durationSeconds: 60, sheetsCut: 1 }, expect: 'startedAt' },
        { label: '0 sheets, not interrupted', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-12-03T08:30', durationSeconds: 60, sheetsCut: 0 }, expect: 'sheetsCut' },
        { label: '0 sheets, interrupted', body: { programId: 5, version: 1, machineId: 2, startedAt: '2026-12-03T08:30', durationSeconds: 60, sheetsCut: 0, interrupted: true }, expect: true },
      ],
    },
  },
  'GET /api/runs/[runId]': { action: 'runs:read' },
  'PATCH /api/runs/[runId]': {
    action: 'runs:write',
    body: { actualSeconds: 2712, reason: 'The timer ran on over lunch.' },
    note: 'who may correct which run (own run on the day; runs:correct-any for any) is decided in correctRun: tests/unit/runs/run-rules.test.ts and tests/integration/runs.test.ts',
    input: {
      wrongTypes: { body: { actualSeconds: 'long', sheetsCut: 2.5, interrupted: 'yes', reason: 4 }, fields: ['actualSeconds', 'interrupted', 'reason', 'sheetsCut'] },
      boundaries: [
        { label: 'a reason only', body: { reason: 'Checked the figures.' }, expect: '_form' },
        { label: 'a 500-character reason', body: { notes: 'Sheet 2 re-cut.', reason: chars(500) }, expect: true },
        { label: 'a 501-character reason', body: { notes: 'Sheet 2 re-cut.', reason: chars(501) }, expect: 'reason' },
        { label: '2000-character notes', body: { notes: chars(2000), reason: 'Longer note.' }, expect: true },
        { label: '2001-character notes', body: { notes: chars(2001), reason: 'Longer note.' }, expect: 'notes' },
        { label: '1000 sheets', body: { sheetsCut: 1000, reason: 'Recount.' }, expect: true },
        { label: '1001 sheets', body: { sheetsCut: 1001, reason: 'Recount.' }, expect: 'sheetsCut' },
      ],
    },
  },
  'POST /api/runs/[runId]/pause': { action: 'runs:write', note: 'the run’s own operator or an admin drives its timer: moveTimer in db/queries/runs.ts, tests/integration/runs.test.ts' },
  'POST /api/runs/[runId]/resume': { action: 'runs:write', note: 'the run’s own operator or an admin drives its timer: moveTimer in db/queries/runs.ts, tests/integration/runs.test.ts' },
  'POST /api/runs/[runId]/finish': {
    action: 'runs:write',
    body: { sheetsCut: 4, interrupted: false, notes: 'Sheet 3 had a warp at one corner.' },
    input: {
      wrongTypes: { body: { sheetsCut: '4', interrupted: 1, notes: 5 }, fields: ['interrupted', 'notes', 'sheetsCut'] },
      boundaries: [
        { label: '0 sheets, not interrupted', body: { sheetsCut: 0, interrupted: false }, expect: 'sheetsCut' },
        { label: '0 sheets, interrupted', body: { sheetsCut: 0, interrupted: true }, expect: true },
        { label: '-1 sheets', body: { sheetsCut: -1, interrupted: true }, expect: 'sheetsCut' },
        { label: '1.5 sheets', body: { sheetsCut: 1.5 }, expect: 'sheetsCut' },
        { label: '"Infinity" sheets', body: { sheetsCut: 'Infinity' }, expect: 'sheetsCut' },
      ],
    },
  },
  'POST /api/runs/[runId]/void': {
    action: 'runs:correct-any',
    body: { reason: 'Started on the wrong program.' },
    input: {
      wrongTypes: { body: { reason: false }, fields: ['reason'] },
      boundaries: [
        { label: 'a blank reason', body: { reason: '   ' }, expect: 'reason' },
        { label: 'a 500-character reason', body: { reason: chars(500) }, expect: true },
        { label: 'a 501-character reason', body: { reason: chars(501) }, expect: 'reason' },
      ],
    },
  },
  'GET /api/machines/[machineId]/calibration': { action: 'runs:read' },
  'POST /api/machines/[machineId]/calibration': {
    action: 'calibration:apply',
    body: { suggestedFactor: 1.084 },
    status: 201,
    input: {
      wrongTypes: { body: { suggestedFactor: '1.084' }, fields: ['suggestedFactor'] },
      boundaries: [
        { label: 'factor 10', body: { suggestedFactor: 10 }, expect: true },
        { label: 'factor 10.001', body: { suggestedFactor: 10.001 }, expect: 'suggestedFactor' },
        { label: 'factor 0', body: { suggestedFactor: 0 }, expect: 'suggestedFactor' },
        { label: 'factor 1e400 (Infinity)', raw: '{"suggestedFactor":1e400}', expect: 'suggestedFactor' },
      ],
    },
  },
  // exports (issue 15): CSV streamed in batches; the first batch answers [] (a header-only file)
  'GET /api/exports/runs.csv': {
    action: 'runs:read',
    query: '?machineId=2&status=finished&from=2026-11-01&to=2026-11-30',
    answers: { runExportBatch: [] },
    badQueries: [
      { query: '?status=stopped', field: 'status' },
      { query: '?machineId=two', field: 'machineId' },
      { query: '?to=2026-02-31', field: 'to' },
    ],
  },
  'GET /api/exports/estimates.csv': {
    action: 'estimates:read',
    query: '?machineId=2',
    answers: { estimateExportBatch: [] },
    badQueries: [
      { query: '?machineId=0', field: 'machineId' },
      { query: '?jobId=1.5', field: 'jobId' },
    ],
  },
  'GET /api/users': { action: 'users:read' },
  'POST /api/users': {
    action: 'users:write',
    body: user,
    status: 201,
    input: {
      wrongTypes: { body: { ...user, role: 'owner', password: 123456789012, name: {} }, fields: ['name', 'password', 'role'] },
      boundaries: [
        { label: 'a 120-character name', body: { ...user, name: chars(120) }, expect: true },
        { label: 'a 160-character name', body: { ...user, name: chars(160) }, expect: 'name' },
        { label: 'a 190-character e-mail', body: { ...user, email: emailOf(190) }, expect: true },
        { label: 'a 191-character e-mail', body: { ...user, email: emailOf(191) }, expect: 'email' },
        { label: 'an 11-character password (ASVS 4.0.3 V2.1.1: 12 at least)', body: { ...user, password: chars(11) }, expect: 'password' },
      ],
    },
  },
  'GET /api/users/[userId]': { action: 'users:read' },
  'PATCH /api/users/[userId]': {
    action: 'users:write',
    body: { role: 'estimator' },
    input: { wrongTypes: { body: { role: 3, disabled: 'maybe' }, fields: ['disabled', 'role'] }, boundaries: [{ label: 'disabled "true" (a form value)', body: { disabled: 'true' }, expect: true }] },
  },
  'PUT /api/users/me/password': {
    action: OWN_PASSWORD,
    body: password,
    input: {
      wrongTypes: { body: { currentPassword: 1, newPassword: true, repeatPassword: null }, fields: ['currentPassword', 'newPassword', 'repeatPassword'] },
      boundaries: [
        { label: 'new passwords that differ', body: { ...password, repeatPassword: 'another pass phrase' }, expect: 'repeatPassword' },
        { label: 'a 73-byte password (bcrypt reads 72)', body: { ...password, newPassword: chars(73), repeatPassword: chars(73) }, expect: 'newPassword' },
      ],
    },
  },
};

const machineForm = {
  name: 'Router 3',
  'travelMm.x': '2500', 'travelMm.y': '1250', 'travelMm.z': '150',
  'homeMm.x': '0', 'homeMm.y': '0', 'homeMm.z': '0',
  'maxFeedMmPerMin.x': '20000', 'maxFeedMmPerMin.y': '20000', 'maxFeedMmPerMin.z': '6000',
  'rapidMmPerMin.x': '30000', 'rapidMmPerMin.y': '30000', 'rapidMmPerMin.z': '9000',
  'accelMmPerS2.x': '1000', 'accelMmPerS2.y': '1000', 'accelMmPerS2.z': '500',
  cornerToleranceMm: '0.02', lookaheadBlocks: '64', maxBlocksPerS: '500', chordToleranceMm: '0.003',
  toolChangeSeconds: '15', spindleSpinUpSeconds: '4', timeFactor: '1',
  hourlyRateMinor: '7500', defaultHoldDown: 'clamps',
};

const jobForm = { title: 'Price-tag holders, 3 mm acrylic', customerId: '3', sheetWidthMm: '1220', sheetLengthMm: '2440', sheetThicknessMm: '3', holdDown: 'tape-glue', quantity: '200' };

export const ACTION_SPECS: Record<string, ActionSpec> = {
  'app/(auth)/change-password/actions.ts changePasswordAction': { action: OWN_PASSWORD, form: password },
  'app/(shop)/admin/users/actions.ts createUserAction': { action: 'users:write', form: user },
  'app/(shop)/admin/users/actions.ts changeRoleAction': { action: 'users:write', form: { userId: '8', role: 'estimator' } },
  'app/(shop)/admin/users/actions.ts setDisabledAction': { action: 'users:write', form: { userId: '8', disabled: 'true' } },
  'app/(shop)/admin/users/actions.ts setOneTimePasswordAction': { action: 'users:write', form: { userId: '8', oneTimePassword: 'a one-time phrase 4' } },
  'app/(shop)/customers/actions.ts createCustomerAction': { action: 'customers:write', form: customer },
  'app/(shop)/jobs/actions.ts createJobAction': { action: 'jobs:write', form: jobForm },
  'app/(shop)/jobs/actions.ts updateJobAction': { action: 'jobs:write', form: { ...jobForm, jobId: '6' } },
  'app/(shop)/machines/actions.ts saveMachineAction': { action: 'machines:write', form: machineForm },
  'app/(shop)/machines/actions.ts removeMachineAction': { action: 'machines:write', form: { machineId: '4' }, answers: { removeMachine: 'archived' } },
  'app/(shop)/machines/actions.ts restoreMachineAction': { action: 'machines:write', form: { machineId: '4' } },
  'app/(shop)/machines/actions.ts addToolAction': { action: 'machines:write', form: { machineId: '4', number: '6', diameterMm: '3.175', flutes: '1', kind: 'upcut' } },
  'app/(shop)/machines/actions.ts updateToolAction': { action: 'machines:write', form: { machineId: '4', toolId: '9', diameterMm: '3.2' } },
  'app/(shop)/machines/actions.ts removeToolAction': { action: 'machines:write', form: { machineId: '4', toolId: '9' } },
  'app/(shop)/machines/actions.ts setLengthUnitAction': { action: 'shop:write', form: { lengthUnit: 'mm' } },
  'app/(shop)/materials/actions.ts createMaterialAction': { action: 'materials:write', form: { name: '3 mm clear acrylic', thicknessMm: '3', sheetWidthMm: '1220', sheetLengthMm: '2440', costPerSheetMinor: '5400' } },
  'app/(shop)/materials/actions.ts updateMaterialAction': { action: 'materials:write', form: { materialId: '3', name: '3 mm clear acrylic', thicknessMm: '3', sheetWidthMm: '1220', sheetLengthMm: '2440', costPerSheetMinor: '5600' } },
  'app/(shop)/materials/actions.ts deleteMaterialAction': { action: 'materials:write', form: { materialId: '3' } },
};
