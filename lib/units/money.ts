// Money for display and input: stored as integer minor units of the shop's currency
// (cents for EUR), shown and typed in major units ("89.00"). The number of minor digits
// comes from the currency (ISO 4217's minor unit column: EUR 2, JPY 0, BHD 3), read from
// the runtime's Intl data, which follows CLDR and agrees with ISO 4217 for these.
// Typed text is read as a decimal string, never through a float, so 0.29 stays 29 cents.

/** How many minor digits the currency has (2 for EUR and GBP, 0 for JPY, 3 for BHD). */
export function minorDigits(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

/** "€89.00" for 8900 EUR minor units, in the given locale (British English by default). */
export function formatMinor(minor: number, currency: string, locale = 'en-GB'): string {
  const digits = minorDigits(currency);
  return new Intl.NumberFormat(locale, { style: 'currency', currency, minimumFractionDigits: digits, maximumFractionDigits: digits }).format(
    minor / 10 ** digits,
  );
}

/** The text a money input shows for a stored amount: "89.00", "1250" (JPY), "0.500" (BHD). */
export function minorToInput(minor: number, currency: string): string {
  const digits = minorDigits(currency);
  const sign = minor < 0 ? '-' : '';
  const abs = String(Math.abs(Math.trunc(minor))).padStart(digits + 1, '0');
  return digits === 0 ? `${sign}${abs}` : `${sign}${abs.slice(0, -digits)}.${abs.slice(-digits)}`;
}

export type MoneyParse = { ok: true; minor: number } | { ok: false; message: string };

/**
 * Reads a non-negative amount typed in major units ("89", "89.5", "89.50", "1,250.00")
 * into minor units. Commas are taken as thousands separators only where they group three
 * digits; more decimals than the currency has are refused, not rounded.
 */
export function parseMajorToMinor(text: string, currency: string): MoneyParse {
  const digits = minorDigits(currency);
  const t = text.trim();
  if (t === '') return { ok: false, message: 'Enter an amount.' };
  const m = /^(\d{1,3}(?:,\d{3})+|\d+)?(?:\.(\d*))?$/.exec(t);
  if (!m || (m[1] === undefined && !m[2])) return { ok: false, message: 'Enter an amount in figures, such as 89.50.' };
  const whole = (m[1] ?? '0').replace(/,/g, '');
  const fraction = m[2] ?? '';
  if (fraction.length > digits) {
    return { ok: false, message: digits === 0 ? `${currency} has no minor unit: enter a whole amount.` : `Use at most ${digits} decimals.` };
  }
  const minor = Number(whole + fraction.padEnd(digits, '0'));
  if (!Number.isSafeInteger(minor) || minor > 2_147_483_647) return { ok: false, message: 'The amount is too large.' };
  return { ok: true, minor };
}
