/**
 * An order's status as a word, a shape and a colour. The shape is a dial that fills as the order
 * moves on (empty when entered, full when shipped), so it reads without colour and in print;
 * a cancelled order's dial is struck through. Late orders carry a separate "Late" badge with a
 * clock, never colour alone.
 */
import { ORDER_STATUS_LABELS, ORDER_STATUSES, type OrderStatus } from '../../contracts/orders';

/** How far round the dial each status is (0–4 quarters); cancelled has its own mark. */
const QUARTERS: Record<OrderStatus, number> = {
  entered: 0,
  acknowledged: 1,
  in_production: 2,
  partly_shipped: 3,
  shipped: 4,
  closed: 4,
  cancelled: 0,
};

const TONE: Record<OrderStatus, string> = {
  entered: 'text-copper-800 bg-copper-50 border-copper-300',
  acknowledged: 'text-graphite-800 bg-white border-graphite-300',
  in_production: 'text-graphite-800 bg-white border-graphite-300',
  partly_shipped: 'text-ok bg-ok-soft border-ok/30',
  shipped: 'text-ok bg-ok-soft border-ok/30',
  closed: 'text-graphite-600 bg-graphite-100 border-graphite-300',
  cancelled: 'text-graphite-500 bg-graphite-100 border-graphite-300 line-through decoration-graphite-400',
};

function Dial({ status }: { status: OrderStatus }) {
  const q = QUARTERS[status];
  // A pie slice from 12 o'clock, clockwise, q quarters round.
  const angle = (q / 4) * 2 * Math.PI;
  const x = 8 + 6 * Math.sin(angle);
  const y = 8 - 6 * Math.cos(angle);
  return (
    <svg viewBox="0 0 16 16" className="size-3.5 shrink-0" aria-hidden focusable="false">
      <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="1.5" />
      {q === 4 && <circle cx="8" cy="8" r="6" fill="currentColor" />}
      {q > 0 && q < 4 && <path d={`M8 8V2A6 6 0 ${q > 2 ? 1 : 0} 1 ${x.toFixed(3)} ${y.toFixed(3)}Z`} fill="currentColor" />}
      {status === 'closed' && <path d="M5 8.2 7.2 10.4 11 6" fill="none" stroke="white" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />}
      {status === 'cancelled' && <path d="M3.4 12.6 12.6 3.4" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />}
    </svg>
  );
}

export function OrderStatusBadge({ status }: { status: OrderStatus }) {
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded border px-1.5 py-px text-sm font-semibold whitespace-nowrap ${TONE[status]}`}
      data-order-status={status}
    >
      <Dial status={status} />
      <span className={status === 'cancelled' ? 'line-through' : undefined}>{ORDER_STATUS_LABELS[status]}</span>
    </span>
  );
}

/** "Late": past the requested ship date and not yet shipped. A clock, the word, and the fault colour. */
export function LateBadge({ title }: { title?: string }) {
  return (
    <span
      className="inline-flex items-center gap-1 rounded border border-fault/40 bg-fault-soft px-1.5 py-px text-sm font-bold whitespace-nowrap text-fault"
      data-late="true"
      title={title ?? 'Past the requested ship date and not yet shipped'}
    >
      <svg viewBox="0 0 16 16" className="size-3.5 shrink-0" aria-hidden focusable="false">
        <circle cx="8" cy="8" r="6.5" fill="currentColor" />
        <path d="M8 4.2V8l2.6 1.8" fill="none" stroke="white" strokeWidth="1.7" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      Late
    </span>
  );
}

const isStatus = (s: string): s is OrderStatus => (ORDER_STATUSES as readonly string[]).includes(s);

/** For rows that carry the status as plain text (the customer detail's order list). */
export function OrderStatusText({ status }: { status: string }) {
  return isStatus(status) ? <OrderStatusBadge status={status} /> : <span>{status}</span>;
}
