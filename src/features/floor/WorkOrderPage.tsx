/**
 * One work order (/work-orders/:id): reached from the board, my work and the traveler's QR code.
 * Header, build sheet essentials, the moves the signed-in user may make, the traveler, and the
 * full history of events (never rewritten: a mistake shows as a reverse move with its note).
 */
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { STAGE_LABELS, type Stage } from '../../contracts/stages';
import { PRIORITIES, type WorkOrderEventRecord } from '../../contracts/work-orders';
import { Alert } from '../../components/Alert';
import { Button, buttonClass } from '../../components/Button';
import { SelectField } from '../../components/Field';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { formatDateTime, formatDay } from '../../lib/format';
import { useCurrentUser, useUnits } from '../../lib/session';
import { PrintTravelers } from '../travelers';
import { useFloorLive, useMoveWorkOrder, useSetPriority, workOrderQuery } from './api';
import { MoveDialog, moveNeedsForm, type MoveTarget } from './MoveDialog';
import { BuildEssentials, DueFlags, HipotCaution, StageTag, WriteError, ageSince, hours, priorityLabel } from './parts';
import { moveDirection } from './stageRules';

const EVENT_WORDS: Record<WorkOrderEventRecord['kind'], string> = { release: 'Released', move: 'Moved', assign: 'Assigned', priority: 'Priority', shipment: 'Part shipped' };

export function WorkOrderPage() {
  const { id: raw } = useParams();
  const id = Number(raw);
  const valid = Number.isInteger(id) && id > 0;
  const user = useCurrentUser();
  const u = useUnits();
  const live = useFloorLive();
  const q = useQuery({ ...workOrderQuery(valid ? id : 0, live.pollMs), enabled: valid });
  const move = useMoveWorkOrder();
  const priority = useSetPriority();
  const [target, setTarget] = useState<MoveTarget | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  if (!valid) return <Alert title="No such work order">The address does not name a work order.</Alert>;
  if (q.isPending) return <Loading what="Loading the work order" />;
  if (q.error) {
    return (
      <Alert title={isApiError(q.error) && q.error.status === 404 ? 'No such work order' : 'Cannot load the work order'}>
        {errorMessage(q.error)}
      </Alert>
    );
  }
  const wo = q.data;
  const foreman = user.role === 'foreman' || user.role === 'admin';

  const start = (to: Stage) => {
    setNotice(null);
    move.reset();
    if (moveNeedsForm(wo.stage, to)) setTarget({ wo, to });
    else move.mutate({ id: wo.id, body: { to, version: wo.version } }, { onSuccess: (d) => setNotice(`Moved to ${STAGE_LABELS[d.stage]}.`) });
  };

  return (
    <div className="flex flex-col gap-5" data-testid="work-order-page" data-stage={wo.stage}>
      <PageHeader
        title={
          <span className="flex flex-wrap items-center gap-3">
            {wo.number} <StageTag stage={wo.stage} large /> <DueFlags wo={wo} large />
          </span>
        }
        lead={
          <>
            {wo.order.customer.name} · order{' '}
            {user.role === 'floor' ? (
              wo.order.number
            ) : (
              <Link className="font-semibold text-copper-700 underline" to={`/orders/${wo.order.id}`}>
                {wo.order.number}
              </Link>
            )}{' '}
            line {wo.line.lineNo}: {wo.line.title}
          </>
        }
        actions={
          <>
            <Link className={buttonClass('secondary', 'lg')} to={`/work-orders/${wo.id}/tests`} data-testid="work-order-tests-link">
              Tests
            </Link>
            <a className={buttonClass('secondary', 'lg')} href={`/api/work-orders/${wo.id}/traveler.pdf`} target="_blank" rel="noreferrer">
              Traveler PDF
            </a>
          </>
        }
      />

      <dl className="grid grid-cols-2 gap-3 rounded-lg border border-graphite-200 bg-white p-4 sm:grid-cols-4">
        {[
          ['Quantity', `×${wo.quantity}`],
          ['Due', formatDay(wo.dueDate)],
          ['Priority', priorityLabel(wo.priority)],
          ['In stage for', ageSince(wo.enteredStageAt)],
          ['Assigned to', wo.assignee ? wo.assignee.name : 'Nobody'],
          ['Station', wo.station ? wo.station.name : 'None'],
          ['Estimated work left', hours(wo.estimatedHours)],
          ['Tolerance', `±${wo.line.tolerancePercent} %`],
        ].map(([k, v]) => (
          <div key={k}>
            <dt className="text-sm font-semibold text-graphite-600">{k}</dt>
            <dd className="text-lg font-semibold text-graphite-950">{v}</dd>
          </div>
        ))}
        {wo.stage === 'on_hold' && (
          <div className="col-span-full rounded border border-caution/40 bg-caution-soft px-3 py-2">
            <dt className="text-sm font-semibold text-caution">Why it is on hold</dt>
            <dd className="text-lg text-graphite-950">{wo.holdReason || 'no reason recorded'}</dd>
          </div>
        )}
      </dl>

      {wo.stage === 'testing' && <HipotCaution />}

      <Panel title="Move">
        <div className="flex flex-col gap-3">
          {(wo.allowedMoves ?? []).length === 0 ? (
            <p className="text-graphite-600">Your role has no move to make on this work order now.</p>
          ) : (
            <div className="flex flex-wrap gap-2">
              {(wo.allowedMoves ?? []).map((to) => {
                const dir = moveDirection(wo.stage, to);
                return (
                  <Button key={to} size="lg" variant={dir === 'forward' ? 'primary' : 'secondary'} onClick={() => start(to)} busy={move.isPending && move.variables?.body.to === to}>
                    <span aria-hidden>{dir === 'forward' ? '→' : dir === 'back' ? '←' : '↷'}</span>
                    {STAGE_LABELS[to]}
                  </Button>
                );
              })}
            </div>
          )}
          <WriteError error={move.error} what="The move was not saved" />
          {notice && <Alert kind="good">{notice}</Alert>}
          {foreman && (
            <div className="flex flex-wrap items-end gap-3 border-t border-graphite-200 pt-3">
              <SelectField
                label="Priority"
                value={String(wo.priority)}
                onChange={(e) => priority.mutate({ id: wo.id, priority: Number(e.target.value), version: wo.version })}
                disabled={priority.isPending}
                wrapperClassName="w-48"
                className="h-12"
              >
                {PRIORITIES.map((p) => (
                  <option key={p} value={p}>
                    {priorityLabel(p)}
                  </option>
                ))}
              </SelectField>
              <div className="flex-1">
                <WriteError error={priority.error} what="The priority was not saved" />
              </div>
            </div>
          )}
        </div>
      </Panel>

      {wo.buildSheet && (
        <Panel title="Build sheet essentials">
          <BuildEssentials sheet={wo.buildSheet} u={u} />
        </Panel>
      )}

      <Panel title="Traveler">
        <div className="flex flex-col gap-3">
          <p className="text-graphite-700">
            The printed traveler carries this work order's barcode and a QR code to this page.{' '}
            <a className="font-semibold text-copper-700 underline" href={`/api/work-orders/${wo.id}/traveler.pdf`} target="_blank" rel="noreferrer">
              Open the traveler PDF
            </a>
            .
          </p>
          <PrintTravelers request={{ workOrderIds: [wo.id] }} label="Print this traveler" />
        </div>
      </Panel>

      <Panel title={`History (${wo.events.length})`}>
        <div className="overflow-x-auto">
          <table className="w-full text-left text-[0.95rem]" data-testid="events">
            <thead className="border-b border-graphite-300 text-sm text-graphite-600">
              <tr>
                <th className="py-2 pr-3">When</th>
                <th className="py-2 pr-3">Who</th>
                <th className="py-2 pr-3">What</th>
                <th className="py-2 pr-3">Station</th>
                <th className="py-2 pr-3">Winding record</th>
                <th className="py-2">Note</th>
              </tr>
            </thead>
            <tbody>
              {[...wo.events].reverse().map((e) => (
                <tr key={e.id} className="border-b border-graphite-100 align-top" data-event-kind={e.kind}>
                  <td className="py-2 pr-3 whitespace-nowrap tabular-nums">{formatDateTime(e.at)}</td>
                  <td className="py-2 pr-3">{e.user ? e.user.name : '—'}</td>
                  <td className="py-2 pr-3">
                    <span className="font-semibold">{EVENT_WORDS[e.kind]}</span>{' '}
                    {e.kind === 'move' || e.kind === 'release'
                      ? `${e.fromStage ? STAGE_LABELS[e.fromStage] : '—'} → ${STAGE_LABELS[e.toStage]}`
                      : e.kind === 'assign'
                        ? `to ${e.assignee ? e.assignee.name : 'nobody'}`
                        : `in ${STAGE_LABELS[e.toStage]}`}
                  </td>
                  <td className="py-2 pr-3">{e.station ? e.station.name : '—'}</td>
                  <td className="py-2 pr-3 tabular-nums">
                    {e.turnsCounter !== null && e.turnsCounter !== undefined ? `${e.turnsCounter} turns` : ''}
                    {e.spoolLot ? `${e.turnsCounter != null ? ', ' : ''}lot ${e.spoolLot}` : ''}
                    {e.turnsCounter == null && !e.spoolLot ? '—' : ''}
                  </td>
                  <td className="py-2">{e.note || '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Panel>

      <MoveDialog target={target} onClose={() => setTarget(null)} onMoved={(d) => setNotice(`Moved to ${STAGE_LABELS[d.stage]}.`)} />
    </div>
  );
}
