// Admin page: the shop's users, their roles and whether they can sign in.
import type { Metadata } from 'next';
import { DataTable } from '@/components/ui/data-table';
import { PageHeader } from '@/components/ui/page-header';
import { CreateUserForm } from '@/components/users/create-user-form';
import { UserRowControls } from '@/components/users/user-row-controls';
import { listUsers } from '@/db/queries/users';
import { guardPage } from '@/lib/auth/page-guard';
import { ROLE_LABELS } from '@/lib/validation/enums';
import { changeRoleAction, createUserAction, setDisabledAction, setOneTimePasswordAction } from './actions';

export const metadata: Metadata = { title: 'Users' };

export default async function UsersPage() {
  const admin = await guardPage('users');
  const users = await listUsers(admin.shopId);
  return (
    <>
      <PageHeader title="Users" lead="Who can sign in to your shop, and with which role." />
      <div className="grid items-start gap-8 xl:grid-cols-[2fr_1fr]">
        <DataTable
          caption="Your shop's users"
          rows={users}
          rowKey={(u) => u.id}
          columns={[
            { key: 'name', header: 'Name', cell: (u) => <span className="font-bold">{u.name}</span> },
            { key: 'email', header: 'E-mail', cell: (u) => u.email },
            { key: 'role', header: 'Role', cell: (u) => ROLE_LABELS[u.role] },
            {
              key: 'state',
              header: 'Sign-in',
              cell: (u) =>
                u.disabled ? (
                  <span className="whitespace-nowrap font-bold text-ink-soft">✕ Disabled</span>
                ) : u.mustChangePassword ? (
                  <span className="whitespace-nowrap font-bold text-caution">✓ Enabled, one-time password</span>
                ) : (
                  <span className="whitespace-nowrap font-bold text-ok">✓ Enabled</span>
                ),
            },
            {
              key: 'actions',
              header: 'Change',
              cell: (u) => (
                <UserRowControls
                  user={{ id: u.id, name: u.name, role: u.role, disabled: u.disabled }}
                  isSelf={u.id === admin.id}
                  changeRole={changeRoleAction}
                  setDisabled={setDisabledAction}
                  setOneTimePassword={setOneTimePasswordAction}
                />
              ),
            },
          ]}
        />
        <CreateUserForm action={createUserAction} />
      </div>
    </>
  );
}
