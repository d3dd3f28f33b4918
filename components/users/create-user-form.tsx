'use client';
// The create-user form of the admin page.
import { Button } from '@/components/ui/button';
import { InputField, SelectField } from '@/components/ui/field';
import { ActionNotice } from '@/components/ui/notice';
import { useValidatedAction } from '@/components/ui/use-validated-action';
import type { ActionState } from '@/lib/http/action-state';
import { ROLES, ROLE_LABELS } from '@/lib/validation/enums';
import { createUserSchema, PASSWORD_MIN_CHARS } from '@/lib/validation/users';

type Action = (state: ActionState, form: FormData) => Promise<ActionState>;

export function CreateUserForm({ action }: { action: Action }) {
  const { state, fields, pending, onSubmit, formRef } = useValidatedAction(createUserSchema, action);
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-md border-2 border-rule bg-panel p-5" aria-labelledby="new-user-title">
      <h2 id="new-user-title">New user</h2>
      <ActionNotice state={state} />
      <InputField id="user-name" name="name" label="Name" required errors={fields.name} />
      <InputField id="user-email" name="email" label="E-mail" type="email" autoComplete="off" required errors={fields.email} />
      <SelectField id="user-role" name="role" label="Role" defaultValue="operator" errors={fields.role} options={ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))} />
      <InputField
        id="user-password"
        name="password"
        label="Their password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN_CHARS} characters; common passwords are refused. Tell it to them yourself rather than by e-mail.`}
        required
        errors={fields.password}
      />
      <div>
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : 'Create user'}
        </Button>
      </div>
    </form>
  );
}
