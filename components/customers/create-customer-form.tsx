'use client';
// The create-customer form: shared zod schema in the browser, the server action
// behind it validates again.
import { Button } from '@/components/ui/button';
import { InputField } from '@/components/ui/field';
import { ActionNotice } from '@/components/ui/notice';
import { useValidatedAction } from '@/components/ui/use-validated-action';
import type { ActionState } from '@/lib/http/action-state';
import { customerInputSchema } from '@/lib/validation/customers';

export function CreateCustomerForm({ action }: { action: (state: ActionState, form: FormData) => Promise<ActionState> }) {
  const { state, fields, pending, onSubmit, formRef } = useValidatedAction(customerInputSchema, action);
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-md border-2 border-rule bg-panel p-5" aria-labelledby="new-customer-title">
      <h2 id="new-customer-title">New customer</h2>
      <ActionNotice state={state} />
      <InputField id="customer-name" name="name" label="Name" required errors={fields.name} />
      <InputField id="customer-email" name="email" label="E-mail" type="email" required errors={fields.email} />
      <InputField id="customer-phone" name="phone" label="Phone" type="tel" hint="Optional." errors={fields.phone} />
      <InputField id="customer-notes" name="notes" label="Notes" hint="Optional: delivery, contact person, usual material." errors={fields.notes} />
      <div>
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : 'Add customer'}
        </Button>
      </div>
    </form>
  );
}
