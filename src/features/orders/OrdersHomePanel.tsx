/** The office home's orders panel: what waits for acknowledgement, what is late, what is due soon. */
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { buttonClass } from '../../components/Button';
import { Loading, Panel } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { addDaysIso, todayIso } from '../../lib/format';
import { ordersQuery } from './api';
import { LateBadge } from './status';

export function OrdersHomePanel() {
  const orders = useQuery(ordersQuery());
  const today = todayIso();
  const week = addDaysIso(today, 7);
  const data = orders.data ?? [];
  const entered = data.filter((o) => o.status === 'entered').length;
  const late = data.filter((o) => o.late).length;
  const dueSoon = data.filter((o) => !o.late && o.dueDate >= today && o.dueDate <= week && !['shipped', 'closed', 'cancelled'].includes(o.status)).length;
  const row = 'flex items-center justify-between gap-3 border-t border-graphite-100 py-1.5 first:border-0';
  return (
    <Panel
      title="Orders"
      actions={
        <Link to="/orders/new" className={buttonClass('primary', 'sm')}>
          New order
        </Link>
      }
    >
      {orders.isPending ? (
        <Loading what="Counting orders" />
      ) : orders.isError ? (
        <p className="text-fault">{errorMessage(orders.error)}</p>
      ) : (
        <ul className="text-sm">
          <li className={row}>
            <Link to="/orders" className="font-semibold text-copper-700 hover:underline">
              Entered, waiting for acknowledgement
            </Link>
            <span className="tabular text-lg font-bold">{entered}</span>
          </li>
          <li className={row}>
            <Link to="/orders?late=1" className="flex items-center gap-2 font-semibold text-copper-700 hover:underline">
              <LateBadge /> past the requested ship date
            </Link>
            <span className="tabular text-lg font-bold text-fault">{late}</span>
          </li>
          <li className={row}>
            <Link to={`/orders?dueFrom=${today}&dueTo=${week}`} className="font-semibold text-copper-700 hover:underline">
              Due to ship in the next 7 days
            </Link>
            <span className="tabular text-lg font-bold">{dueSoon}</span>
          </li>
        </ul>
      )}
    </Panel>
  );
}
