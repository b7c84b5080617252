import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import type { SessionUser } from '../../contracts/auth';
import { ROLE_LABELS, ROLES } from '../../contracts/roles';
import { buttonClass } from '../../components/Button';
import { Loading, Panel } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { plural } from '../../lib/format';
import { usersQuery } from '../users';
import { HealthPanel } from './HealthPanel';
import { AccountPanel, DutiesPanel, HomeFrame } from './parts';

function UsersSummary() {
  const users = useQuery(usersQuery);
  return (
    <Panel
      title="People"
      actions={
        <Link to="/users" className={buttonClass('primary', 'sm')}>
          Open Users
        </Link>
      }
    >
      {users.isPending ? (
        <Loading what="Counting users" />
      ) : users.isError ? (
        <p className="text-fault">{errorMessage(users.error)}</p>
      ) : (
        <>
          <p className="text-lg">
            <span className="text-3xl font-bold text-graphite-950 tabular" data-testid="user-count">
              {users.data.filter((u) => u.active).length}
            </span>{' '}
            active of {plural(users.data.length, 'user')}
          </p>
          <table className="mt-3 w-full text-sm">
            <caption className="sr-only">Active users by role</caption>
            <tbody>
              {ROLES.map((r) => (
                <tr key={r} className="border-t border-graphite-100">
                  <th scope="row" className="py-1 text-left font-medium text-graphite-700">
                    {ROLE_LABELS[r]}
                  </th>
                  <td className="py-1 text-right font-semibold">{users.data.filter((u) => u.active && u.role === r).length}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </Panel>
  );
}

export function AdminHome({ user }: { user: SessionUser }) {
  return (
    <HomeFrame user={user}>
      <div className="grid gap-5 lg:grid-cols-[2fr_1fr]">
        <HealthPanel />
        <UsersSummary />
      </div>
      <div className="grid gap-5 lg:grid-cols-2">
        <DutiesPanel user={user} />
        <AccountPanel user={user} />
      </div>
    </HomeFrame>
  );
}
