'use server';
// The change-password form's action: any signed-in user, also one who must replace a
// one-time password. The current password is asked again; the other sessions end.
import { changeOwnPassword } from '@/db/queries/users';
import { currentSessionId, requireRole } from '@/lib/auth/require-role';
import { runAction, type ActionState } from '@/lib/http/action-state';
import { ROLES } from '@/lib/validation/enums';
import { formDataToObject, parseOrThrow } from '@/lib/validation/form';
import { changeOwnPasswordSchema } from '@/lib/validation/users';

export async function changePasswordAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const user = await requireRole(ROLES, 'password', { duringPasswordChange: true });
    const input = parseOrThrow(changeOwnPasswordSchema, formDataToObject(form), 'password');
    await changeOwnPassword(user.shopId, user.id, input.currentPassword, input.newPassword, await currentSessionId());
    return 'Your password is changed. Other places where you were signed in are signed out.';
  });
}
