// GET /api/customers/:customerId and PATCH to change it; another shop's customer is 404.
import { getCustomer, updateCustomer } from '@/db/queries/customers';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { customerUpdateSchema } from '@/lib/validation/customers';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ customerId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('customers:read');
  const customerId = parseId((await params).customerId, 'customer');
  const customer = await getCustomer(user.shopId, customerId);
  if (!customer) throw new AppError('not-found:customer', 'No such customer.');
  return json({ customer });
});

export const PATCH = handle(async (request, { params }: Context) => {
  const user = await requireAction('customers:write');
  const customerId = parseId((await params).customerId, 'customer');
  const input = parseOrThrow(customerUpdateSchema, await readJson(request), 'customer');
  return json({ customer: await updateCustomer(user.shopId, customerId, input) });
});
