import { useQuery } from '@tanstack/react-query';
import { STAGE_LABELS } from '../../contracts/stages';
import { PRIORITY_LABELS, workOrderListResponse, type Priority } from '../../contracts/work-orders';
import { Alert } from '../../components/Alert';
import { Loading, Panel } from '../../components/Panel';
import { api, errorMessage } from '../../lib/api';
import { formatDay, pieces } from '../../lib/format';
import { useCurrentUser } from '../../lib/session';
import { PrintTravelers } from './PrintTravelers';

/** Roles that may print travelers (the server's rule; the client only hides the button). */
const PRINTERS = ['engineer', 'foreman', 'office', 'admin'];

/** An order's work orders with their travelers, and printing the whole order at once. */
export function OrderWorkOrders({ orderId }: { orderId: number }) {
  const me = useCurrentUser();
  const list = useQuery({
    queryKey: ['work-orders', { orderId }],
    queryFn: async ({ signal }) => (await api.get(`/work-orders?orderId=${orderId}`, { schema: workOrderListResponse, signal })).workOrders,
  });
  if (list.isPending) return <Loading what="Loading work orders" />;
  if (list.error) return <Alert title="Cannot load the work orders">{errorMessage(list.error)}</Alert>;
  if (!list.data.length) return null;
  return (
    <Panel title={`Work orders (${list.data.length})`}>
      <table className="w-full text-sm">
        <thead>
          <tr className="text-left text-xs text-graphite-500 uppercase">
            <th className="py-1 pr-3 font-semibold">Number</th>
            <th className="py-1 pr-3 font-semibold">Line</th>
            <th className="py-1 pr-3 text-right font-semibold">Quantity</th>
            <th className="py-1 pr-3 font-semibold">Stage</th>
            <th className="py-1 pr-3 font-semibold">Priority</th>
            <th className="py-1 pr-3 font-semibold">Due</th>
            <th className="py-1 font-semibold">Traveler</th>
          </tr>
        </thead>
        <tbody>
          {list.data.map((w) => (
            <tr key={w.id} className="border-t border-graphite-100" data-work-order={w.number}>
              <td className="py-1.5 pr-3 font-semibold tabular-nums">{w.number}</td>
              <td className="py-1.5 pr-3">
                {w.line.lineNo}. {w.line.title}
              </td>
              <td className="py-1.5 pr-3 text-right tabular-nums">{pieces(w.quantity)}</td>
              <td className="py-1.5 pr-3">{STAGE_LABELS[w.stage]}</td>
              <td className="py-1.5 pr-3">{PRIORITY_LABELS[w.priority as Priority] ?? w.priority}</td>
              <td className="py-1.5 pr-3">{formatDay(w.dueDate)}</td>
              <td className="py-1.5">
                <a className="text-copper-700 underline" href={`/api/work-orders/${w.id}/traveler.pdf`} target="_blank" rel="noreferrer">
                  PDF
                </a>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {PRINTERS.includes(me.role) && (
        <div className="mt-4 border-t border-graphite-100 pt-3">
          <PrintTravelers request={{ orderId }} label="Print all travelers of this order" />
        </div>
      )}
    </Panel>
  );
}
