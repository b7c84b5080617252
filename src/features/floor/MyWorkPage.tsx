/** My work: what is assigned to me, most urgent first, with the build sheet's essentials in big type. */
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { Alert } from '../../components/Alert';
import { buttonClass } from '../../components/Button';
import { Loading, PageHeader } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { formatDay, plural } from '../../lib/format';
import { useUnits } from '../../lib/session';
import { myWorkQuery, useFloorLive } from './api';
import { LiveBadge } from './BoardPage';
import { BuildEssentials, DueFlags, StageTag, ageSince, hours, priorityLabel } from './parts';

export function MyWorkPage() {
  const u = useUnits();
  const live = useFloorLive();
  const work = useQuery(myWorkQuery(live.pollMs));
  const list = work.data ?? [];
  return (
    <div className="flex flex-col gap-5" data-testid="my-work">
      <PageHeader
        title="My work"
        lead={work.data ? `${plural(list.length, 'job')} assigned to you, most urgent first.` : undefined}
        actions={
          <>
            <LiveBadge state={live.state} />
            <Link to="/scan" className={buttonClass('primary', 'lg')}>
              Scan station
            </Link>
          </>
        }
      />
      {work.isPending && <Loading what="Loading your work" />}
      {work.error && <Alert title="Cannot load your work">{errorMessage(work.error)}</Alert>}
      {work.data && list.length === 0 && (
        <Alert kind="idle" title="Nothing assigned to you">
          Ask the foreman for the next job, or scan a traveler at the scan station.
        </Alert>
      )}
      <ol className="flex flex-col gap-4">
        {list.map((w, i) => (
          <li key={w.id} data-work-order={w.number}>
            <article className={`rounded-lg border bg-white p-4 ${w.late ? 'border-2 border-fault' : w.atRisk ? 'border-2 border-dashed border-caution' : 'border-graphite-300'}`}>
              <div className="flex flex-wrap items-start justify-between gap-3">
                <div className="flex items-start gap-3">
                  <span className="flex size-10 shrink-0 items-center justify-center rounded-full bg-graphite-800 text-lg font-bold text-white" aria-label={`Number ${i + 1} in your queue`}>
                    {i + 1}
                  </span>
                  <div>
                    <h2 className="text-3xl font-bold tracking-tight text-graphite-950">{w.number}</h2>
                    <p className="text-lg text-graphite-800">
                      {w.order.customer.name} · {w.line.title}
                    </p>
                    <p className="text-graphite-700">
                      ×{w.quantity} · due {formatDay(w.dueDate)} · {priorityLabel(w.priority)} · {w.station ? w.station.name : 'no station'} · in stage {ageSince(w.enteredStageAt)} · {hours(w.estimatedHours)} left
                    </p>
                  </div>
                </div>
                <div className="flex flex-col items-end gap-2">
                  <StageTag stage={w.stage} large />
                  <DueFlags wo={w} large />
                </div>
              </div>
              {w.stage === 'on_hold' && w.holdReason && <p className="mt-2 font-semibold text-caution">Held: {w.holdReason}</p>}
              <div className="mt-3">
                <BuildEssentials sheet={w.buildSheet} u={u} />
              </div>
              <div className="mt-3 flex justify-end">
                <Link to={`/work-orders/${w.id}`} className={buttonClass('primary', 'lg', 'h-14 px-8 text-lg')}>
                  Open {w.number}
                </Link>
              </div>
            </article>
          </li>
        ))}
      </ol>
    </div>
  );
}
