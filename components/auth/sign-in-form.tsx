'use client';
// The sign-in form. It checks the fields with the shared zod schema first (so an
// empty field is named at once), then posts to next-auth's credentials callback.
// A failure shows one generic message and puts focus on it.
import { signIn } from 'next-auth/react';
import { useEffect, useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { InputField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { signInErrorMessage } from '@/lib/auth/messages';
import type { FieldErrors } from '@/lib/errors';
import { fieldErrors } from '@/lib/validation/form';
import { signInSchema } from '@/lib/validation/sign-in';

export function SignInForm({ callbackPath, initialError }: { callbackPath: string; initialError: string | null }) {
  const [error, setError] = useState<string | null>(initialError);
  const [fields, setFields] = useState<FieldErrors>({});
  const [pending, setPending] = useState(false);
  const errorRef = useRef<HTMLDivElement>(null);
  // Bumped on every failed attempt, so focus returns to the message even when its text repeats.
  const [failures, setFailures] = useState(0);

  useEffect(() => {
    if (failures > 0) errorRef.current?.focus();
  }, [failures]);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const parsed = signInSchema.safeParse({ email: form.get('email'), password: form.get('password') });
    if (!parsed.success) {
      setFields(fieldErrors(parsed.error));
      setError(null);
      return;
    }
    setFields({});
    setPending(true);
    const result = await signIn('credentials', { ...parsed.data, redirect: false, callbackUrl: callbackPath });
    if (result?.ok && !result.error) {
      // A full load, so that the server renders the shell with the new session cookie.
      window.location.assign(callbackPath);
      return;
    }
    setPending(false);
    setError(signInErrorMessage(result?.error ?? 'failed'));
    setFailures((n) => n + 1);
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5" aria-label="Sign in">
      {error ? (
        <div ref={errorRef} tabIndex={-1} data-testid="sign-in-error">
          <Notice tone="fault" title={error} role="alert" />
        </div>
      ) : null}
      <InputField id="email" label="E-mail" type="email" autoComplete="username" autoFocus required errors={fields.email} />
      <InputField id="password" label="Password" type="password" autoComplete="current-password" required errors={fields.password} />
      <Button type="submit" disabled={pending} className="w-full text-lg">
        {pending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
