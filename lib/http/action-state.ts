// What a server action answers to its form: ok with a message, or the typed error's
// message and field issues. runAction turns a thrown AppError into that state; any
// other failure is logged and reported as a generic message.
import { isAppError, type FieldErrors } from '@/lib/errors';
import { logUnexpected } from './log-error';

export interface ActionState {
  status: 'idle' | 'ok' | 'error';
  message?: string;
  fields?: FieldErrors;
  /** changes on every answer, so a form can react to two equal answers in a row */
  at?: number;
}

export const IDLE: ActionState = { status: 'idle' };

export async function runAction(body: () => Promise<string>): Promise<ActionState> {
  try {
    return { status: 'ok', message: await body(), at: Date.now() };
  } catch (error) {
    if (isAppError(error)) return { status: 'error', message: error.message, fields: error.fields, at: Date.now() };
    logUnexpected('a server action', error);
    return { status: 'error', message: 'Something went wrong on the server. Try again.', at: Date.now() };
  }
}
