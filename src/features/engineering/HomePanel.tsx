/** The engineer's home: the next lines waiting for a build sheet. */
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { Panel } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { errorMessage } from '../../lib/api';
import { formatDay } from '../../lib/format';
import { queueQuery } from './api';
import { linePath } from './paths';

export function EngineeringHomePanel() {
  const queue = useQuery(queueQuery);
  return (
    <Panel
      title="Waiting for engineering"
      actions={
        <Link to="/engineering" className="text-sm font-semibold text-copper-700 hover:underline">
          Open the queue
        </Link>
      }
    >
      {queue.isPending ? (
        <p className="text-graphite-500">Loading…</p>
      ) : queue.isError ? (
        <p className="text-fault">{errorMessage(queue.error)}</p>
      ) : queue.data.length === 0 ? (
        <p className="text-graphite-600">Nothing waits for a build sheet.</p>
      ) : (
        <>
          <p className="mb-2 text-graphite-700">
            {queue.data.length} {queue.data.length === 1 ? 'line waits' : 'lines wait'}; {queue.data.filter((l) => l.late).length} late.
          </p>
          <ul className="flex flex-col divide-y divide-graphite-100">
            {queue.data.slice(0, 5).map((l) => (
              <li key={l.lineId} className="flex flex-wrap items-center gap-2 py-1.5 text-sm">
                <Link to={linePath(l.lineId)} className="font-semibold text-copper-700 hover:underline">
                  {l.order.number} / {l.lineNo}
                </Link>
                <span className="text-graphite-800">{l.title}</span>
                <span className="ml-auto text-graphite-600">due {formatDay(l.dueDate)}</span>
                {l.late && <StatusBadge kind="fault">Late</StatusBadge>}
              </li>
            ))}
          </ul>
        </>
      )}
    </Panel>
  );
}
