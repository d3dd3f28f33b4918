'use client';
// Client half of the "validate on both sides" rule: check the form with the shared
// zod schema, show field issues at once, and only then run the server action (which
// validates again). Field issues from the server replace the local ones.
import { useActionState, useEffect, useRef, useState, startTransition, type FormEvent } from 'react';
import type { z } from '@/lib/validation/zod';
import type { FieldErrors } from '@/lib/errors';
import { IDLE, type ActionState } from '@/lib/http/action-state';
import { fieldErrors, formDataToObject } from '@/lib/validation/form';

export function useValidatedAction(schema: z.ZodType, action: (state: ActionState, form: FormData) => Promise<ActionState>) {
  const [state, dispatch, pending] = useActionState(action, IDLE);
  const [localFields, setLocalFields] = useState<FieldErrors | null>(null);
  const formRef = useRef<HTMLFormElement>(null);

  useEffect(() => {
    if (state.status === 'ok') formRef.current?.reset();
  }, [state]);

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const parsed = schema.safeParse(formDataToObject(form));
    if (!parsed.success) {
      setLocalFields(fieldErrors(parsed.error));
      return;
    }
    setLocalFields(null);
    startTransition(() => dispatch(form));
  }

  const fields = localFields ?? (state.status === 'error' ? state.fields ?? {} : {});
  return { state: localFields ? IDLE : state, fields, pending, onSubmit, formRef };
}
