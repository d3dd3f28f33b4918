import 'server-only';
// Customers of a shop. Every function takes the shop id; a row of another shop is
// reported exactly like a missing one.
import { and, asc, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { customers, type Customer } from '@/db/schema';
import { AppError } from '@/lib/errors';
import type { CustomerInput, CustomerUpdate } from '@/lib/validation/customers';

export async function listCustomers(shopId: number): Promise<Customer[]> {
  return db.select().from(customers).where(eq(customers.shopId, shopId)).orderBy(asc(customers.name));
}

export async function getCustomer(shopId: number, customerId: number): Promise<Customer | null> {
  const rows = await db
    .select()
    .from(customers)
    .where(and(eq(customers.shopId, shopId), eq(customers.id, customerId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function createCustomer(shopId: number, input: CustomerInput): Promise<Customer> {
  const [{ id }] = await db
    .insert(customers)
    .values({ shopId, name: input.name, email: input.email, phone: input.phone ?? '', notes: input.notes ?? null })
    .$returningId();
  const created = await getCustomer(shopId, id);
  if (!created) throw new AppError('internal', 'The customer was not saved.');
  return created;
}

export async function updateCustomer(shopId: number, customerId: number, input: CustomerUpdate): Promise<Customer> {
  const existing = await getCustomer(shopId, customerId);
  if (!existing) throw new AppError('not-found:customer', 'No such customer.');
  const changes = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
  await db.update(customers).set(changes).where(and(eq(customers.shopId, shopId), eq(customers.id, customerId)));
  return { ...existing, ...changes };
}
