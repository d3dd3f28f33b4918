// Glue between zod and the places input arrives: FormData from forms and server
// actions, JSON bodies in route handlers. Issues become { field: [messages] } so
// that a form can show each message beside its field and a route can answer 422.
import { z } from '@/lib/validation/zod';
import { AppError, type FieldErrors } from '@/lib/errors';

export function fieldErrors(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length > 0 ? issue.path.join('.') : '_form';
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

/** FormData → plain object; empty strings become undefined so optional fields stay optional. */
export function formDataToObject(form: FormData): Record<string, string | undefined> {
  const out: Record<string, string | undefined> = {};
  for (const [key, value] of form.entries()) {
    if (typeof value !== 'string' || key.startsWith('$ACTION')) continue;
    out[key] = value.trim() === '' ? undefined : value;
  }
  return out;
}

/** Parses or throws the typed 422 error carrying every field issue. */
export function parseOrThrow<T extends z.ZodType>(schema: T, input: unknown, what: string): z.output<T> {
  const result = schema.safeParse(input);
  if (!result.success) {
    throw new AppError(`invalid:${what}`, `Some of the ${what} details need fixing: each one is named at its field.`, fieldErrors(result.error));
  }
  return result.data;
}
