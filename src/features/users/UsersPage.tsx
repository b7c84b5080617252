import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { ROLE_LABELS } from '../../contracts/roles';
import type { UserRecord } from '../../contracts/users';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Dialog } from '../../components/Dialog';
import { Loading, PageHeader } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { errorMessage } from '../../lib/api';
import { formatDateTime } from '../../lib/format';
import { useCurrentUser } from '../../lib/session';
import { usersQuery } from './api';
import { ActiveForm, ChangeRoleForm, CreateUserForm, ResetPasswordForm } from './UserForms';

type Open = { kind: 'create' } | { kind: 'role' | 'password' | 'active'; user: UserRecord } | null;

const col = createColumnHelper<UserRecord>();

export function UsersPage() {
  const me = useCurrentUser();
  const users = useQuery(usersQuery);
  const [open, setOpen] = useState<Open>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const close = () => setOpen(null);
  const done = (message: string) => {
    setOpen(null);
    setNotice(message);
  };

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Name',
        cell: (c) => (
          <span className="font-semibold text-graphite-900">
            {c.getValue()}
            {c.row.original.id === me.id && <span className="ml-1.5 text-xs font-medium text-graphite-500">(you)</span>}
          </span>
        ),
      }),
      col.accessor('email', { header: 'E-mail', cell: (c) => <span className="text-graphite-700">{c.getValue()}</span> }),
      col.accessor((u) => ROLE_LABELS[u.role], { id: 'role', header: 'Role', meta: { filter: 'select' } }),
      col.accessor((u) => u.customerName ?? '', {
        id: 'company',
        header: 'Company',
        cell: (c) => c.getValue() || <span className="text-graphite-400">—</span>,
      }),
      col.accessor((u) => (u.active ? 'Active' : 'Deactivated'), {
        id: 'status',
        header: 'Status',
        meta: { filter: 'select' },
        cell: (c) => <StatusBadge kind={c.row.original.active ? 'good' : 'idle'}>{c.getValue()}</StatusBadge>,
      }),
      col.accessor((u) => u.lastLoginAt ?? '', {
        id: 'lastLogin',
        header: 'Last sign-in',
        cell: (c) => <span className="tabular whitespace-nowrap">{formatDateTime(c.row.original.lastLoginAt)}</span>,
        meta: { csv: (u) => u.lastLoginAt ?? '' },
      }),
      col.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => {
          const u = c.row.original;
          return (
            <div className="flex justify-end gap-1.5">
              <Button size="sm" onClick={() => setOpen({ kind: 'role', user: u })} aria-label={`Change role of ${u.name}`}>
                Role
              </Button>
              <Button size="sm" onClick={() => setOpen({ kind: 'password', user: u })} aria-label={`Reset password of ${u.name}`}>
                Password
              </Button>
              <Button
                size="sm"
                variant={u.active ? 'danger' : 'secondary'}
                className="w-24"
                disabled={u.id === me.id}
                title={u.id === me.id ? 'You cannot deactivate your own account' : undefined}
                onClick={() => setOpen({ kind: 'active', user: u })}
                aria-label={`${u.active ? 'Deactivate' : 'Reactivate'} ${u.name}`}
              >
                {u.active ? 'Deactivate' : 'Reactivate'}
              </Button>
            </div>
          );
        },
      }),
    ],
    [me.id],
  );

  return (
    <div>
      <PageHeader
        title="Users"
        lead="Who may sign in, and with which role. A role decides which screens a person sees and what the server lets them do."
        actions={
          <Button variant="primary" onClick={() => setOpen({ kind: 'create' })}>
            New user
          </Button>
        }
      />
      {notice && (
        <div className="mb-3">
          <Alert kind="good" title={notice} />
        </div>
      )}
      {users.isPending ? (
        <Loading what="Loading users" />
      ) : users.isError ? (
        <Alert kind="fault" title="Could not load the users">
          {errorMessage(users.error)}
        </Alert>
      ) : (
        <DataTable
          data={users.data}
          columns={columns}
          noun="user"
          csvName="spoolwright-users"
          caption="Users"
          getRowId={(u) => String(u.id)}
          initialSorting={[{ id: 'name', desc: false }]}
        />
      )}

      <Dialog open={open?.kind === 'create'} title="New user" onClose={close}>
        <CreateUserForm onCancel={close} onDone={(u) => done(`Created ${u.name} (${u.email}) as ${ROLE_LABELS[u.role]}.`)} />
      </Dialog>
      {open && open.kind !== 'create' && (
        <Dialog
          open
          onClose={close}
          title={
            open.kind === 'role'
              ? `Change role — ${open.user.name}`
              : open.kind === 'password'
                ? `Reset password — ${open.user.name}`
                : `${open.user.active ? 'Deactivate' : 'Reactivate'} ${open.user.name}`
          }
        >
          {open.kind === 'role' && (
            <ChangeRoleForm user={open.user} isSelf={open.user.id === me.id} onCancel={close} onDone={() => done(`${open.user.name}'s role is changed.`)} />
          )}
          {open.kind === 'password' && (
            <ResetPasswordForm user={open.user} onCancel={close} onDone={() => done(`A new password is set for ${open.user.name}.`)} />
          )}
          {open.kind === 'active' && (
            <ActiveForm
              user={open.user}
              onCancel={close}
              onDone={() => done(`${open.user.name} is ${open.user.active ? 'deactivated' : 'active again'}.`)}
            />
          )}
        </Dialog>
      )}
    </div>
  );
}
