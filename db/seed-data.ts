// The demo shop of our invented scenario: Alder & Finch Shopfitting builds retail
// displays from birch plywood, acrylic and HDPE on two routers. Money in euro cents.
import type { HOLD_DOWNS, JOB_STATUSES, ROLES, Z_ZEROS } from './schema';

export const DEMO_PASSWORD = 'kerfcast-demo';
export const BCRYPT_COST = 10;

export const demoShop = { name: 'Alder & Finch Shopfitting', slug: 'alder-finch', currency: 'EUR' };

export const demoUsers: { name: string; email: string; role: (typeof ROLES)[number] }[] = [
  { name: 'Ada', email: 'ada@alder-finch.example', role: 'admin' },
  { name: 'Priya', email: 'priya@alder-finch.example', role: 'programmer' },
  { name: 'Tomas', email: 'tomas@alder-finch.example', role: 'estimator' },
  { name: 'Lena', email: 'lena@alder-finch.example', role: 'operator' },
];

export const demoMachines: {
  fixture: string;
  hourlyRateMinor: number;
  defaultHoldDown: (typeof HOLD_DOWNS)[number];
  /** invented demo value: what Router 1's table holds under a covered sheet */
  defaultVacuumKpa: number | null;
  toolDescriptions: Record<number, string>;
}[] = [
  {
    fixture: 'router-1.json',
    hourlyRateMinor: 9500,
    defaultHoldDown: 'vacuum',
    defaultVacuumKpa: 61,
    toolDescriptions: {
      1: '1/4 in compression spiral, plywood profiles',
      2: '1/8 in single-flute upcut, acrylic',
      3: '6 mm downcut, clean top edges',
      4: '90° V-bit, engraving and chamfers',
    },
  },
  {
    fixture: 'router-2.json',
    hourlyRateMinor: 7000,
    defaultHoldDown: 'clamps',
    defaultVacuumKpa: null,
    toolDescriptions: {
      1: '1/4 in upcut spiral, HDPE',
      2: '1/8 in downcut spiral',
      3: '1/2 in straight, surfacing',
      4: '1/4 in ball nose, juice grooves',
    },
  },
];

export const demoMaterials = [
  { name: 'Birch plywood 18 mm', thicknessMm: 18, sheetWidthMm: 1220, sheetLengthMm: 2440, costPerSheetMinor: 8900 },
  { name: 'Cast acrylic 3 mm', thicknessMm: 3, sheetWidthMm: 1250, sheetLengthMm: 2500, costPerSheetMinor: 7400 },
  { name: 'HDPE 12 mm', thicknessMm: 12, sheetWidthMm: 1220, sheetLengthMm: 2440, costPerSheetMinor: 16500 },
] as const;

export const demoCustomers = [
  {
    name: 'Marlow Street Bakery',
    email: 'orders@marlow-street-bakery.example',
    phone: '',
    notes: 'Shop window refit in spring; wants food-safe boards.',
  },
  {
    name: 'Hollin Outdoor Gear',
    email: 'displays@hollin-outdoor.example',
    phone: '',
    notes: 'Price-tag holders for every shelf edge, in two store layouts.',
  },
] as const;

export const demoJobs: {
  title: string;
  customer: (typeof demoCustomers)[number]['name'];
  material: (typeof demoMaterials)[number]['name'];
  /** the demo machine (by name) the job is planned on */
  machine: 'Router 1' | 'Router 2';
  zZero: (typeof Z_ZEROS)[number];
  holdDown: (typeof HOLD_DOWNS)[number];
  vacuumKpa: number | null;
  quantity: number;
  status: (typeof JOB_STATUSES)[number];
}[] = [
  {
    title: 'Window display shelf brackets',
    customer: 'Marlow Street Bakery',
    material: 'Birch plywood 18 mm',
    machine: 'Router 1',
    zZero: 'top', // the shelf-bracket program is written with Z zero on top of the sheet (its depths are negative, down to the through-cut)
    holdDown: 'vacuum',
    // about 18 inHg, mid-range for a router-shop vacuum table (common practice)
    vacuumKpa: 61,
    quantity: 24,
    status: 'programmed',
  },
  {
    title: 'Shelf-edge price-tag holders',
    customer: 'Hollin Outdoor Gear',
    material: 'Cast acrylic 3 mm',
    machine: 'Router 1',
    zZero: 'top',
    holdDown: 'tape-glue',
    vacuumKpa: null,
    quantity: 240,
    status: 'draft',
  },
  {
    title: 'Cutting-board blanks',
    customer: 'Marlow Street Bakery',
    material: 'HDPE 12 mm',
    machine: 'Router 2',
    zZero: 'top',
    holdDown: 'tabs',
    vacuumKpa: null,
    quantity: 40,
    status: 'quoted',
  },
];
