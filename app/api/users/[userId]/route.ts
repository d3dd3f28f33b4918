// GET /api/users/:userId and PATCH { role?, disabled?, oneTimePassword? } (admin); another
// shop's user is 404. A one-time password ends the user's sessions and must be replaced
// at their next sign-in.
import { changeUserRole, getUser, setOneTimePassword, setUserDisabled } from '@/db/queries/users';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { updateUserSchema } from '@/lib/validation/users';

type Context = { params: Promise<{ userId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const admin = await requireAction('users:read');
  const userId = parseId((await params).userId, 'user');
  const user = await getUser(admin.shopId, userId);
  if (!user) throw new AppError('not-found:user', 'No such user.');
  return json({ user });
});

export const PATCH = handle(async (request, { params }: Context) => {
  const admin = await requireAction('users:write');
  const userId = parseId((await params).userId, 'user');
  const input = parseOrThrow(updateUserSchema, await readJson(request), 'user');
  let user = input.role !== undefined ? await changeUserRole(admin.shopId, admin.id, userId, input.role) : null;
  if (input.disabled !== undefined) user = await setUserDisabled(admin.shopId, admin.id, userId, input.disabled);
  if (input.oneTimePassword !== undefined) user = await setOneTimePassword(admin.shopId, admin.id, userId, input.oneTimePassword);
  return json({ user });
});
