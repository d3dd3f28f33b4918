'use client';
// Per-user controls on the admin page: change the role, disable or enable, set a
// one-time password. The admin's own row offers none (the server refuses them too).
import { useActionState } from 'react';
import { Button } from '@/components/ui/button';
import { IDLE, type ActionState } from '@/lib/http/action-state';
import { ROLES, ROLE_LABELS, type Role } from '@/lib/validation/enums';
import { PASSWORD_MIN_CHARS } from '@/lib/validation/users';

type Action = (state: ActionState, form: FormData) => Promise<ActionState>;

interface Props {
  user: { id: number; name: string; role: Role; disabled: boolean };
  isSelf: boolean;
  changeRole: Action;
  setDisabled: Action;
  setOneTimePassword: Action;
}

function Feedback({ state }: { state: ActionState }) {
  if (state.status === 'idle') return null;
  const text = state.fields ? Object.values(state.fields).flat()[0] ?? state.message : state.message;
  return (
    <p role={state.status === 'error' ? 'alert' : 'status'} className={`text-sm font-bold ${state.status === 'error' ? 'text-fault' : 'text-ok'}`}>
      <span aria-hidden="true">{state.status === 'error' ? '▲ ' : '✓ '}</span>
      {text}
    </p>
  );
}

export function UserRowControls({ user, isSelf, changeRole, setDisabled, setOneTimePassword }: Props) {
  const [roleState, roleAction, rolePending] = useActionState(changeRole, IDLE);
  const [disabledState, disabledAction, disabledPending] = useActionState(setDisabled, IDLE);
  const [passwordState, passwordAction, passwordPending] = useActionState(setOneTimePassword, IDLE);
  if (isSelf) return <p className="text-sm text-ink-soft">Your own account: only another admin can change its role or disable it.</p>;
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-2">
        <form action={roleAction} className="flex items-center gap-2">
          <input type="hidden" name="userId" value={user.id} />
          <label htmlFor={`role-${user.id}`} className="sr-only">
            Role of {user.name}
          </label>
          <select id={`role-${user.id}`} name="role" defaultValue={user.role} className="min-h-target rounded-md border-2 border-rule bg-panel px-2">
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
          <Button type="submit" variant="secondary" disabled={rolePending}>
            Change role
          </Button>
        </form>
        <form action={disabledAction}>
          <input type="hidden" name="userId" value={user.id} />
          <input type="hidden" name="disabled" value={user.disabled ? 'false' : 'true'} />
          <Button type="submit" variant={user.disabled ? 'secondary' : 'danger'} disabled={disabledPending}>
            {user.disabled ? 'Enable' : 'Disable'}
          </Button>
        </form>
      </div>
      <details>
        <summary className="cursor-pointer text-sm font-bold text-spruce">One-time password…</summary>
        <form action={passwordAction} className="mt-2 flex flex-wrap items-center gap-2">
          <input type="hidden" name="userId" value={user.id} />
          <label htmlFor={`otp-${user.id}`} className="sr-only">
            One-time password for {user.name}
          </label>
          <input
            id={`otp-${user.id}`}
            name="oneTimePassword"
            type="password"
            autoComplete="new-password"
            minLength={PASSWORD_MIN_CHARS}
            placeholder={`${PASSWORD_MIN_CHARS}+ characters`}
            className="min-h-target rounded-md border-2 border-rule bg-panel px-2"
          />
          <Button type="submit" variant="secondary" disabled={passwordPending}>
            Set, sign them out
          </Button>
        </form>
      </details>
      <Feedback state={roleState} />
      <Feedback state={disabledState} />
      <Feedback state={passwordState} />
    </div>
  );
}
