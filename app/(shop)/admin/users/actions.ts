'use server';
// Server actions of the admin users page: create a user, change a role, disable or
// enable an account, set a one-time password. Each starts with the same guard as the
// route handlers.
import { revalidatePath } from 'next/cache';
import { changeUserRole, createUser, setOneTimePassword, setUserDisabled } from '@/db/queries/users';
import { requireAction } from '@/lib/auth/require-role';
import { runAction, type ActionState } from '@/lib/http/action-state';
import { formDataToObject, parseOrThrow } from '@/lib/validation/form';
import { ROLE_IN_SENTENCE } from '@/lib/validation/enums';
import { parseId } from '@/lib/validation/ids';
import { changeRoleSchema, createUserSchema, oneTimePasswordSchema, setDisabledSchema } from '@/lib/validation/users';

export async function createUserAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const admin = await requireAction('users:write');
    const input = parseOrThrow(createUserSchema, formDataToObject(form), 'user');
    const user = await createUser(admin.shopId, input);
    revalidatePath('/admin/users');
    return `${user.name} can now sign in as ${user.email}.`;
  });
}

export async function changeRoleAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const admin = await requireAction('users:write');
    const userId = parseId(String(form.get('userId') ?? ''), 'user');
    const { role } = parseOrThrow(changeRoleSchema, formDataToObject(form), 'user');
    const user = await changeUserRole(admin.shopId, admin.id, userId, role);
    revalidatePath('/admin/users');
    return `${user.name} is now ${ROLE_IN_SENTENCE[role]}.`;
  });
}

export async function setDisabledAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const admin = await requireAction('users:write');
    const userId = parseId(String(form.get('userId') ?? ''), 'user');
    const { disabled } = parseOrThrow(setDisabledSchema, formDataToObject(form), 'user');
    const user = await setUserDisabled(admin.shopId, admin.id, userId, disabled);
    revalidatePath('/admin/users');
    return disabled ? `${user.name} can no longer sign in.` : `${user.name} can sign in again.`;
  });
}

export async function setOneTimePasswordAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const admin = await requireAction('users:write');
    const userId = parseId(String(form.get('userId') ?? ''), 'user');
    const { oneTimePassword } = parseOrThrow(oneTimePasswordSchema, formDataToObject(form), 'user');
    const user = await setOneTimePassword(admin.shopId, admin.id, userId, oneTimePassword);
    revalidatePath('/admin/users');
    return `${user.name} is signed out everywhere and must choose a new password after signing in with this one.`;
  });
}
