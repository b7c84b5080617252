/**
 * Ready to ship: every work order waiting in packing, by customer and order, with the order's
 * requested ship date (late ones marked with a word and a clock, and a stripe). Choose work orders
 * of one customer and prepare their shipment; the server checks each again when it is created.
 */
import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link, useNavigate } from 'react-router';
import type { ReadyToShip, ReadyWorkOrder } from '../../contracts/shipments';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { Loading, PageHeader } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { errorMessage } from '../../lib/api';
import { formatDay, formatDateTime, pieces, plural } from '../../lib/format';
import { LineName } from '../../components/LineName';
import { useCurrentUser } from '../../lib/session';
import { AddressBlock } from '../customers';
import { LateBadge } from '../orders';
import { readyQuery } from './api';
import { Serials } from '../../components/Serials';

type Customer = ReadyToShip['customers'][number];

/** The path of the new-shipment form for these work orders. */
export const newShipmentHref = (ids: number[]) => `/shipments/new?wo=${ids.join(',')}`;

function ReadyState({ wo }: { wo: ReadyWorkOrder }) {
  if (wo.ready)
    return (
      <div className="flex flex-col gap-0.5">
        <StatusBadge kind="good">Ready</StatusBadge>
        {wo.inspectedBy && (
          <span className="text-xs text-graphite-600">
            Inspected by {wo.inspectedBy.name}
            {wo.inspectedAt ? `, ${formatDateTime(wo.inspectedAt)}` : ''}
          </span>
        )}
      </div>
    );
  return (
    <div className="flex flex-col gap-1">
      <StatusBadge kind="caution">Not ready</StatusBadge>
      <ul className="list-disc pl-4 text-sm text-graphite-800" aria-label={`Why ${wo.number} may not ship yet`}>
        {wo.reasons.map((r) => (
          <li key={r}>{r}</li>
        ))}
      </ul>
    </div>
  );
}

function CustomerGroup({
  customer,
  selected,
  lockedTo,
  canShip,
  onToggle,
}: {
  customer: Customer;
  selected: Set<number>;
  lockedTo: { id: number; name: string } | null;
  canShip: boolean;
  onToggle: (wo: ReadyWorkOrder, on: boolean) => void;
}) {
  const otherCustomer = lockedTo !== null && lockedTo.id !== customer.id;
  const woCount = customer.orders.reduce((n, o) => n + o.workOrders.length, 0);
  const readyCount = customer.orders.reduce((n, o) => n + o.workOrders.filter((w) => w.ready).length, 0);
  return (
    <section
      aria-labelledby={`cust-${customer.id}`}
      className={`rounded-lg border bg-white ${otherCustomer ? 'border-graphite-200 opacity-75' : 'border-graphite-300'}`}
      data-customer={customer.name}
    >
      <header className="flex flex-wrap items-start justify-between gap-3 border-b border-graphite-200 px-4 py-2.5">
        <div>
          <h2 id={`cust-${customer.id}`} className="text-lg font-bold text-graphite-950">
            {customer.name}
          </h2>
          <p className="text-sm text-graphite-600">
            {plural(woCount, 'work order')} in packing, {readyCount} ready to ship
          </p>
        </div>
        <div className="max-w-xs text-sm">
          <p className="text-xs font-semibold tracking-wide text-graphite-500 uppercase">Ships to</p>
          <AddressBlock address={customer.shipTo} empty="No address on file — enter one on the shipment." />
        </div>
      </header>
      {otherCustomer && (
        <p className="border-b border-graphite-200 bg-graphite-50 px-4 py-1.5 text-sm text-graphite-700">
          A shipment carries one customer’s work orders. Clear the selection of {lockedTo.name} to choose these.
        </p>
      )}
      <div className="flex flex-col">
        {customer.orders.map((o) => (
          <div key={o.id} className={`border-b border-graphite-100 last:border-b-0 ${o.late ? 'shadow-[inset_4px_0_0_#a8261f]' : ''}`} data-order={o.number}>
            <div className="flex flex-wrap items-center gap-x-4 gap-y-1 px-4 pt-2.5">
              <Link to={`/orders/${o.id}`} className="font-semibold text-copper-700 underline-offset-2 hover:underline">
                Order {o.number}
              </Link>
              <span className="text-sm text-graphite-700">PO {o.purchaseOrder}</span>
              <span className={`text-sm ${o.late ? 'font-semibold text-fault' : 'text-graphite-700'}`}>Ship by {formatDay(o.dueDate)}</span>
              {o.late && <LateBadge />}
            </div>
            <div className="overflow-x-auto px-4 pb-2">
              <table className="mt-1 w-full border-collapse text-sm">
                <caption className="sr-only">Work orders of order {o.number}</caption>
                <thead className="text-left text-graphite-600">
                  <tr>
                    <th scope="col" className="w-10 py-1 font-semibold">
                      <span className="sr-only">Choose</span>
                    </th>
                    <th scope="col" className="py-1 pr-3 font-semibold">
                      Work order
                    </th>
                    <th scope="col" className="py-1 pr-3 font-semibold">
                      Line
                    </th>
                    <th scope="col" className="py-1 pr-3 text-right font-semibold whitespace-nowrap">
                      To ship
                    </th>
                    <th scope="col" className="py-1 pr-3 font-semibold">
                      Serials
                    </th>
                    <th scope="col" className="py-1 font-semibold">
                      State
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {o.workOrders.map((w) => {
                    const disabled = !canShip || !w.ready || w.quantity === 0 || otherCustomer;
                    const why = !w.ready ? 'Not ready to ship' : otherCustomer ? 'Another customer’s work orders are chosen' : undefined;
                    return (
                      <tr key={w.id} className="border-t border-graphite-100 align-top" data-work-order={w.number} data-ready={w.ready}>
                        <td className="py-1.5">
                          {canShip && (
                            <input
                              type="checkbox"
                              className="size-6 accent-copper-600 disabled:opacity-40"
                              aria-label={`Ship ${w.number}`}
                              checked={selected.has(w.id)}
                              disabled={disabled}
                              title={why}
                              onChange={(e) => onToggle(w, e.target.checked)}
                            />
                          )}
                        </td>
                        <td className="py-1.5 pr-3">
                          <Link to={`/work-orders/${w.id}`} className="font-semibold whitespace-nowrap text-graphite-900 underline-offset-2 hover:underline">
                            {w.number}
                          </Link>
                        </td>
                        <td className="py-1.5 pr-3">
                          <LineName line={w} />
                        </td>
                        <td className="tabular py-1.5 pr-3 text-right font-semibold whitespace-nowrap">{pieces(w.quantity)}</td>
                        <td className="py-1.5 pr-3">
                          <Serials serials={w.serials} />
                        </td>
                        <td className="py-1.5">
                          <ReadyState wo={w} />
                        </td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
          </div>
        ))}
      </div>
    </section>
  );
}

export function ReadyPage() {
  const user = useCurrentUser();
  const canShip = user.role === 'shipping' || user.role === 'admin';
  const ready = useQuery(readyQuery);
  const navigate = useNavigate();
  const [selected, setSelected] = useState<Map<number, { customerId: number; quantity: number }>>(new Map());

  const customers = ready.data?.customers ?? [];
  // Work orders that left the list (shipped by someone else, sent back) drop out of the selection.
  const chosen = useMemo(() => {
    const present = new Map<number, { customerId: number; quantity: number }>();
    for (const c of customers) for (const o of c.orders) for (const w of o.workOrders) if (selected.has(w.id) && w.ready) present.set(w.id, { customerId: c.id, quantity: w.quantity });
    return present;
  }, [customers, selected]);
  const lockedId = chosen.size ? [...chosen.values()][0].customerId : null;
  const locked = lockedId === null ? null : (customers.find((c) => c.id === lockedId) ?? null);
  const units = [...chosen.values()].reduce((n, s) => n + s.quantity, 0);

  const toggle = (customerId: number) => (wo: ReadyWorkOrder, on: boolean) =>
    setSelected(() => {
      const next = new Map(chosen);
      if (on) next.set(wo.id, { customerId, quantity: wo.quantity });
      else next.delete(wo.id);
      return next;
    });

  const lateOrders = customers.reduce((n, c) => n + c.orders.filter((o) => o.late).length, 0);
  const readyCount = customers.reduce((n, c) => n + c.orders.reduce((m, o) => m + o.workOrders.filter((w) => w.ready).length, 0), 0);

  return (
    <div className={chosen.size ? 'pb-24' : undefined}>
      <PageHeader
        title="Ready to ship"
        lead="Work orders in packing, by customer and order. A work order ships once its units have passed their tests and its inspection is signed; the server checks again when the shipment is recorded."
      />
      {ready.isPending ? (
        <Loading what="Loading the packing bench" />
      ) : ready.isError ? (
        <Alert kind="fault" title="Could not load the work orders in packing">
          {errorMessage(ready.error)}
        </Alert>
      ) : customers.length === 0 ? (
        <Alert kind="idle" title="Nothing in packing">
          No work order is waiting in packing just now.
        </Alert>
      ) : (
        <div className="flex flex-col gap-4">
          <p className="flex flex-wrap items-center gap-x-4 gap-y-1 text-graphite-700" data-testid="ready-summary">
            <span>
              <span className="font-semibold text-graphite-900">{readyCount}</span> ready to ship for {plural(customers.length, 'customer')}
            </span>
            {lateOrders > 0 && (
              <span className="inline-flex items-center gap-1.5">
                <LateBadge /> {plural(lateOrders, 'order')} past the requested ship date
              </span>
            )}
          </p>
          {customers.map((c) => (
            <CustomerGroup key={c.id} customer={c} selected={new Set(chosen.keys())} lockedTo={locked} canShip={canShip} onToggle={toggle(c.id)} />
          ))}
        </div>
      )}

      {canShip && chosen.size > 0 && locked && (
        <div className="fixed inset-x-0 bottom-0 z-20 border-t-[3px] border-copper-500 bg-graphite-900 text-white" role="region" aria-label="Chosen for shipment">
          <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-3 px-4 py-2.5">
            <p className="flex-1 text-[1.05rem]" data-testid="selection">
              <span className="font-bold">{plural(chosen.size, 'work order')}</span> of {locked.name} chosen · {pieces(units)}
            </p>
            <Button variant="secondary" onClick={() => setSelected(new Map())}>
              Clear
            </Button>
            <Button variant="primary" size="lg" onClick={() => navigate(newShipmentHref([...chosen.keys()]))}>
              Prepare shipment
            </Button>
          </div>
        </div>
      )}
    </div>
  );
}
