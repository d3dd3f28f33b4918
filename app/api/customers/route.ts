// GET /api/customers: the shop's customers. POST /api/customers: create one.
import { createCustomer, listCustomers } from '@/db/queries/customers';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { customerInputSchema } from '@/lib/validation/customers';
import { parseOrThrow } from '@/lib/validation/form';

export const GET = handle(async () => {
  const user = await requireAction('customers:read');
  return json({ customers: await listCustomers(user.shopId) });
});

export const POST = handle(async (request) => {
  const user = await requireAction('customers:write');
  const input = parseOrThrow(customerInputSchema, await readJson(request), 'customer');
  return json({ customer: await createCustomer(user.shopId, input) }, 201);
});
