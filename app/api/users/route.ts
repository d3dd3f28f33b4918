// GET /api/users: the shop's users (admin). POST /api/users: create one (admin).
import { createUser, listUsers } from '@/db/queries/users';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { createUserSchema } from '@/lib/validation/users';

export const GET = handle(async () => {
  const user = await requireAction('users:read');
  return json({ users: await listUsers(user.shopId) });
});

export const POST = handle(async (request) => {
  const admin = await requireAction('users:write');
  const input = parseOrThrow(createUserSchema, await readJson(request), 'user');
  return json({ user: await createUser(admin.shopId, input) }, 201);
});
