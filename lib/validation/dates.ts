// A calendar date typed in a form or sent as JSON: ISO 8601's calendar date YYYY-MM-DD
// (ISO 8601-1:2019 §5.2.2.1, the form an <input type="date"> submits per the HTML Standard's
// "valid date string"), a real day of the Gregorian calendar, years 2000–2999.
import { z } from '@/lib/validation/zod';

export function isCalendarDate(value: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  if (!m) return false;
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (month < 1 || month > 12 || day < 1) return false;
  // day 0 of the next month is the last day of this one
  const days = new Date(Date.UTC(year, month, 0)).getUTCDate();
  return day <= days;
}

export const dueDateSchema = z
  .string({ error: 'Enter the due date as a date.' })
  .trim()
  .refine(isCalendarDate, 'Enter the due date as a real date, like 2027-03-31.')
  .refine((v) => v >= '2000-01-01' && v <= '2999-12-31', 'Enter a due date between the years 2000 and 2999.');
