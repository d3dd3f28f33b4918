// PUT /api/users/me/password { currentPassword, newPassword, repeatPassword }: any
// signed-in user changes their own password, also one who must replace a one-time
// password. The current password is asked again; the user's other sessions end.
import { changeOwnPassword } from '@/db/queries/users';
import { currentSessionId, requireRole } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { ROLES } from '@/lib/validation/enums';
import { parseOrThrow } from '@/lib/validation/form';
import { changeOwnPasswordSchema } from '@/lib/validation/users';

export const PUT = handle(async (request) => {
  const user = await requireRole(ROLES, 'password', { duringPasswordChange: true });
  const input = parseOrThrow(changeOwnPasswordSchema, await readJson(request), 'password');
  await changeOwnPassword(user.shopId, user.id, input.currentPassword, input.newPassword, await currentSessionId());
  return json({ changed: true });
});
