/** The shipping bench on the shipping role's home: how much waits, and big links to the two screens. */
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { buttonClass } from '../../components/Button';
import { Panel } from '../../components/Panel';
import { plural } from '../../lib/format';
import { readyQuery } from './api';

export function ShippingHomePanel() {
  const ready = useQuery(readyQuery);
  const workOrders = ready.data?.customers.flatMap((c) => c.orders.flatMap((o) => o.workOrders)) ?? [];
  const late = ready.data?.customers.reduce((n, c) => n + c.orders.filter((o) => o.late).length, 0) ?? 0;
  return (
    <Panel title="Shipping bench">
      <p className="mb-3 text-graphite-700" aria-live="polite">
        {ready.isPending
          ? 'Counting the work orders in packing…'
          : ready.isError
            ? 'Could not count the work orders in packing.'
            : `${plural(workOrders.filter((w) => w.ready).length, 'work order')} ready to ship, ${workOrders.filter((w) => !w.ready).length} still waiting for tests or inspection${late ? `; ${plural(late, 'order')} past the requested ship date` : ''}.`}
      </p>
      <div className="grid grid-cols-2 gap-3">
        <Link to="/shipping" className={buttonClass('primary', 'lg', 'h-16 text-lg')}>
          Ready to ship
        </Link>
        <Link to="/shipments" className={buttonClass('secondary', 'lg', 'h-16 text-lg')}>
          Shipments
        </Link>
      </div>
    </Panel>
  );
}
