'use server';
// Server actions of the customers page.
import { revalidatePath } from 'next/cache';
import { createCustomer } from '@/db/queries/customers';
import { requireAction } from '@/lib/auth/require-role';
import { runAction, type ActionState } from '@/lib/http/action-state';
import { customerInputSchema } from '@/lib/validation/customers';
import { formDataToObject, parseOrThrow } from '@/lib/validation/form';

export async function createCustomerAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const user = await requireAction('customers:write');
    const input = parseOrThrow(customerInputSchema, formDataToObject(form), 'customer');
    const customer = await createCustomer(user.shopId, input);
    revalidatePath('/customers');
    return `Customer “${customer.name}” added.`;
  });
}
