// Customers list, with the create form for roles that may add customers.
import type { Metadata } from 'next';
import { CreateCustomerForm } from '@/components/customers/create-customer-form';
import { DataTable } from '@/components/ui/data-table';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { listCustomers } from '@/db/queries/customers';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { createCustomerAction } from './actions';

export const metadata: Metadata = { title: 'Customers' };

export default async function CustomersPage() {
  const user = await guardPage('customers');
  const customers = await listCustomers(user.shopId);
  return (
    <>
      <PageHeader title="Customers" lead="Who the shop cuts for; quotes are sent to the e-mail given here." />
      <div className="grid items-start gap-8 lg:grid-cols-[2fr_1fr]">
        <section aria-label="Customer list">
          {customers.length === 0 ? (
            <Notice tone="note" title="No customers yet." role="status">Add the first one with the form.</Notice>
          ) : (
            <DataTable
              caption="Your shop's customers"
              rows={customers}
              rowKey={(c) => c.id}
              columns={[
                { key: 'name', header: 'Name', cell: (c) => <span className="font-bold">{c.name}</span> },
                { key: 'email', header: 'E-mail', cell: (c) => c.email },
                { key: 'phone', header: 'Phone', cell: (c) => (c.phone ? <span className="figure">{c.phone}</span> : '—') },
                { key: 'notes', header: 'Notes', cell: (c) => c.notes ?? '' },
              ]}
            />
          )}
        </section>
        {canDo(user.role, 'customers:write') ? <CreateCustomerForm action={createCustomerAction} /> : null}
      </div>
    </>
  );
}
