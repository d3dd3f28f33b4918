'use client';
// For forms whose inputs are not what the server stores: lengths typed in inches, money
// typed in euros. convert() reads the form, turns the inputs into the stored units (mm,
// minor units), checks them with the shared zod schema, and gives either the FormData to
// send or the field errors to show at once. The server action validates again; its field
// errors replace the local ones. After any error, focus moves to the first field named.
import { startTransition, useActionState, useEffect, useRef, useState, type FormEvent } from 'react';
import type { FieldErrors } from '@/lib/errors';
import { IDLE, type ActionState } from '@/lib/http/action-state';

export type Converted = { ok: true; form: FormData } | { ok: false; fields: FieldErrors };

export function useConvertedAction(
  action: (state: ActionState, form: FormData) => Promise<ActionState>,
  convert: (form: FormData) => Converted,
  options: { resetOnSuccess?: boolean } = {},
) {
  const [state, dispatch, pending] = useActionState(action, IDLE);
  const [localFields, setLocalFields] = useState<FieldErrors | null>(null);
  const [attempt, setAttempt] = useState(0);
  const formRef = useRef<HTMLFormElement>(null);

  useEffect(() => {
    if (state.status === 'ok' && options.resetOnSuccess) formRef.current?.reset();
  }, [state, options.resetOnSuccess]);

  useEffect(() => {
    const form = formRef.current;
    if (!form) return;
    const first = form.querySelector<HTMLElement>('[aria-invalid="true"]');
    if (first) first.focus();
    else if (state.status === 'error') form.querySelector<HTMLElement>('[role="alert"]')?.focus();
  }, [attempt, state]);

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const result = convert(new FormData(event.currentTarget));
    setAttempt((n) => n + 1);
    if (!result.ok) {
      setLocalFields(result.fields);
      return;
    }
    setLocalFields(null);
    startTransition(() => dispatch(result.form));
  }

  const fields = localFields ?? (state.status === 'error' ? (state.fields ?? {}) : {});
  return { state: localFields ? IDLE : state, fields, pending, onSubmit, formRef };
}
