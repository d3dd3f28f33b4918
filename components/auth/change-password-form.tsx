'use client';
// The change-password form: current password, the new one twice. Checked with the
// shared schema first; the server then checks the current password and the list of
// common passwords. After a change, a link goes on to the user's first page.
import Link from 'next/link';
import { Button } from '@/components/ui/button';
import { InputField } from '@/components/ui/field';
import { ActionNotice } from '@/components/ui/notice';
import { useValidatedAction } from '@/components/ui/use-validated-action';
import type { ActionState } from '@/lib/http/action-state';
import { changeOwnPasswordSchema, PASSWORD_MIN_CHARS } from '@/lib/validation/users';

type Action = (state: ActionState, form: FormData) => Promise<ActionState>;

export function ChangePasswordForm({ action, homePath }: { action: Action; homePath: string }) {
  const { state, fields, pending, onSubmit, formRef } = useValidatedAction(changeOwnPasswordSchema, action);
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className="flex flex-col gap-5" aria-label="Change password">
      <ActionNotice state={state} />
      {state.status === 'ok' ? (
        <p>
          <Link href={homePath} className="font-bold text-spruce underline">
            Go on to Kerfcast
          </Link>
        </p>
      ) : null}
      <InputField id="current-password" name="currentPassword" label="Current password" type="password" autoComplete="current-password" required errors={fields.currentPassword} />
      <InputField
        id="new-password"
        name="newPassword"
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN_CHARS} characters; a phrase of a few words is easy to remember. Common passwords are refused.`}
        required
        errors={fields.newPassword}
      />
      <InputField id="repeat-password" name="repeatPassword" label="New password again" type="password" autoComplete="new-password" required errors={fields.repeatPassword} />
      <Button type="submit" disabled={pending} className="w-full text-lg">
        {pending ? 'Changing…' : 'Change password'}
      </Button>
    </form>
  );
}
