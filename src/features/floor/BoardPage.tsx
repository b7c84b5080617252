/**
 * The board: one column per stage the floor works in (ready … packing, then on hold and rework),
 * a card per work order. The foreman filters it, selects cards and reassigns them (all or
 * nothing, with the versions seen), and drags a card to another column to move it. The live feed
 * refreshes it when anyone changes anything; a stale version is shown, never overwritten.
 */
import { useQuery } from '@tanstack/react-query';
import { useMemo, useState, type DragEvent } from 'react';
import { Link } from 'react-router';
import { STAGE_LABELS, type Stage } from '../../contracts/stages';
import type { WorkOrderSummary } from '../../contracts/work-orders';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { Dialog } from '../../components/Dialog';
import { SelectField } from '../../components/Field';
import { Loading, PageHeader } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { addDaysIso, formatDay, plural, todayIso } from '../../lib/format';
import { useCurrentUser } from '../../lib/session';
import { boardQuery, floorPeopleQuery, stationsQuery, useAssignWorkOrders, useFloorLive, useMoveWorkOrder, type LiveState } from './api';
import { MoveDialog, moveNeedsForm, type MoveTarget } from './MoveDialog';
import { DueFlags, HoldIcon, StageTag, WriteError, ageSince, hours, priorityLabel } from './parts';
import { BOARD_STAGES, moveDirection } from './stageRules';

type DueWindow = 'all' | 'late' | '3' | '7' | '14';
type Filters = { station: string; person: string; customer: string; due: DueWindow };
const NO_FILTERS: Filters = { station: '', person: '', customer: '', due: 'all' };
/** "none" in a person / station filter: nobody or no station assigned. */
const NONE = 'none';

function matches(w: WorkOrderSummary, f: Filters, today: string): boolean {
  if (f.station && (f.station === NONE ? w.station !== null : String(w.station?.id) !== f.station)) return false;
  if (f.person && (f.person === NONE ? Boolean(w.assignee) : String(w.assignee?.id) !== f.person)) return false;
  if (f.customer && String(w.order.customer.id) !== f.customer) return false;
  if (f.due === 'late' && !w.late) return false;
  if (f.due !== 'all' && f.due !== 'late' && w.dueDate > addDaysIso(today, Number(f.due))) return false;
  return true;
}

/** Most urgent first: priority, then late, then at risk, then the earliest due date. */
function urgency(a: WorkOrderSummary, b: WorkOrderSummary): number {
  return b.priority - a.priority || Number(b.late) - Number(a.late) || Number(b.atRisk) - Number(a.atRisk) || a.dueDate.localeCompare(b.dueDate) || a.number.localeCompare(b.number);
}

function uniqueBy<T>(items: (T | null | undefined)[], key: (t: T) => number): T[] {
  const m = new Map<number, T>();
  for (const it of items) if (it) m.set(key(it), it);
  return [...m.values()];
}

export function LiveBadge({ state }: { state: LiveState }) {
  const words = state === 'live' ? 'Live' : state === 'polling' ? 'Refreshing every 10 s' : 'Connecting…';
  return (
    <span data-live={state} className="inline-flex items-center gap-1.5 rounded-full border border-graphite-300 bg-white px-3 py-1 text-sm font-semibold text-graphite-700">
      <span aria-hidden className={`size-2.5 ${state === 'live' ? 'rounded-full bg-ok' : state === 'polling' ? 'rotate-45 bg-caution' : 'rounded-full border-2 border-graphite-400'}`} />
      {words}
    </span>
  );
}

export function BoardPage() {
  const user = useCurrentUser();
  const canAssign = user.role === 'foreman' || user.role === 'admin';
  const live = useFloorLive();
  const board = useQuery(boardQuery(live.pollMs));
  const [filters, setFilters] = useState<Filters>(NO_FILTERS);
  const [selected, setSelected] = useState<Set<number>>(new Set());
  const [dragging, setDragging] = useState<WorkOrderSummary | null>(null);
  const [over, setOver] = useState<Stage | null>(null);
  const [target, setTarget] = useState<MoveTarget | null>(null);
  const [picking, setPicking] = useState<WorkOrderSummary | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [refused, setRefused] = useState<string | null>(null);
  const quickMove = useMoveWorkOrder();
  const today = todayIso();

  const all = board.data ?? [];
  const shown = useMemo(() => all.filter((w) => matches(w, filters, today)).sort(urgency), [all, filters, today]);
  const byStage = useMemo(() => {
    const m = new Map<Stage, WorkOrderSummary[]>(BOARD_STAGES.map((s) => [s, []]));
    for (const w of shown) m.get(w.stage)?.push(w);
    return m;
  }, [shown]);

  const stationOptions = uniqueBy(all.map((w) => w.station), (s) => s.id).sort((a, b) => a.name.localeCompare(b.name));
  const personOptions = uniqueBy(all.map((w) => w.assignee), (p) => p.id).sort((a, b) => a.name.localeCompare(b.name));
  const customerOptions = uniqueBy(all.map((w) => w.order.customer), (c) => c.id).sort((a, b) => a.name.localeCompare(b.name));
  // Selected cards that are still on the board (a card another user moved off drops out).
  const selectedCards = all.filter((w) => selected.has(w.id));

  const toggle = (id: number) =>
    setSelected((s) => {
      const n = new Set(s);
      if (n.has(id)) n.delete(id);
      else n.add(id);
      return n;
    });

  /** A move chosen by drop or by the Move button: ask for what it needs, or send it at once. */
  const startMove = (wo: WorkOrderSummary, to: Stage) => {
    setNotice(null);
    quickMove.reset();
    if (moveNeedsForm(wo.stage, to)) {
      setTarget({ wo, to });
      return;
    }
    quickMove.mutate(
      { id: wo.id, body: { to, version: wo.version } },
      { onSuccess: (d) => setNotice(`${d.number} moved to ${STAGE_LABELS[d.stage]}.`) },
    );
  };

  const onDrop = (e: DragEvent, stage: Stage) => {
    e.preventDefault();
    setOver(null);
    const wo = dragging;
    setDragging(null);
    if (!wo || wo.stage === stage) return;
    if (!wo.allowedMoves?.includes(stage)) {
      setNotice(null);
      quickMove.reset();
      setRefused(`${wo.number} cannot go from ${STAGE_LABELS[wo.stage]} to ${STAGE_LABELS[stage]} — the move rules do not allow it for your role.`);
      return;
    }
    startMove(wo, stage);
  };
  return (
    <div data-testid="board" className="flex flex-col gap-4">
      <PageHeader
        title="Board"
        lead="Every work order on the floor, by stage. Drag a card to move it; tick cards to reassign them."
        actions={<LiveBadge state={live.state} />}
      />

      <div className="flex flex-wrap items-end gap-3 rounded-lg border border-graphite-200 bg-white p-3" role="group" aria-label="Filters">
        <SelectField label="Station" value={filters.station} onChange={(e) => setFilters({ ...filters, station: e.target.value })} wrapperClassName="min-w-40" className="h-12">
          <option value="">Every station</option>
          <option value={NONE}>No station</option>
          {stationOptions.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Person" value={filters.person} onChange={(e) => setFilters({ ...filters, person: e.target.value })} wrapperClassName="min-w-40" className="h-12">
          <option value="">Everyone</option>
          <option value={NONE}>Nobody assigned</option>
          {personOptions.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Customer" value={filters.customer} onChange={(e) => setFilters({ ...filters, customer: e.target.value })} wrapperClassName="min-w-44" className="h-12">
          <option value="">Every customer</option>
          {customerOptions.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Due" value={filters.due} onChange={(e) => setFilters({ ...filters, due: e.target.value as DueWindow })} wrapperClassName="min-w-40" className="h-12">
          <option value="all">Any date</option>
          <option value="late">Late only</option>
          <option value="3">Within 3 days</option>
          <option value="7">Within 7 days</option>
          <option value="14">Within 14 days</option>
        </SelectField>
        {filters !== NO_FILTERS && (
          <Button variant="quiet" size="lg" onClick={() => setFilters(NO_FILTERS)}>
            Clear filters
          </Button>
        )}
        <p className="ml-auto self-center text-sm text-graphite-600" aria-live="polite">
          {plural(shown.length, 'work order')} shown of {all.length}
        </p>
      </div>

      {canAssign && <AssignBar cards={selectedCards} onClear={() => setSelected(new Set())} />}

      {board.error && <Alert title="Cannot load the board">{errorMessage(board.error)}</Alert>}
      {refused && (
        <div data-testid="drop-refused">
          <Alert kind="caution" title="Move not allowed">
            {refused}
          </Alert>
        </div>
      )}
      <WriteError error={quickMove.error} what="The move was not saved" />
      {notice && (
        <Alert kind="good" title="Moved">
          {notice}
        </Alert>
      )}

      {board.isPending ? (
        <Loading what="Loading the board" />
      ) : (
        <div className="-mx-4 overflow-x-auto px-4 pb-3" data-testid="board-columns">
          <div className="flex min-w-max gap-3">
            {BOARD_STAGES.map((stage) => {
              const cards = byStage.get(stage) ?? [];
              const est = cards.reduce((t, w) => t + w.estimatedHours, 0);
              const canDrop = dragging !== null && dragging.stage !== stage && Boolean(dragging.allowedMoves?.includes(stage));
              const side = stage === 'on_hold' || stage === 'rework';
              return (
                <section
                  key={stage}
                  data-column={stage}
                  aria-label={`${STAGE_LABELS[stage]}: ${plural(cards.length, 'work order')}`}
                  onDragOver={(e) => {
                    if (!dragging) return;
                    e.preventDefault();
                    e.dataTransfer.dropEffect = canDrop ? 'move' : 'none';
                    if (over !== stage) setOver(stage);
                  }}
                  onDragLeave={(e) => {
                    if (!e.currentTarget.contains(e.relatedTarget as Node | null)) setOver((o) => (o === stage ? null : o));
                  }}
                  onDrop={(e) => onDrop(e, stage)}
                  className={`flex w-64 shrink-0 flex-col self-start rounded-lg border-2 transition-colors ${
                    dragging && over === stage ? (canDrop ? 'border-copper-500 bg-copper-50' : 'border-fault/50 bg-fault-soft') : side ? 'border-graphite-300 bg-graphite-100' : 'border-transparent bg-graphite-100'
                  } ${dragging && canDrop && over !== stage ? 'outline-2 outline-offset-[-2px] outline-copper-300 outline-dashed' : ''}`}
                >
                  <header className={`rounded-t-md px-3 py-2 ${side ? 'bg-graphite-200' : 'bg-graphite-800 text-white'}`}>
                    <h2 className="flex items-center gap-1.5 text-lg font-bold">
                      {stage === 'on_hold' && <HoldIcon />}
                      {STAGE_LABELS[stage]}
                    </h2>
                    <p className={`text-sm tabular-nums ${side ? 'text-graphite-700' : 'text-graphite-200'}`} data-testid={`column-count-${stage}`}>
                      {plural(cards.length, 'job')} · {hours(est)} est.
                    </p>
                  </header>
                  <ol className="flex max-h-[calc(100vh-9rem)] min-h-40 flex-1 flex-col gap-2 overflow-y-auto overscroll-contain p-2" tabIndex={-1}>
                    {cards.map((w) => (
                      <li key={w.id}>
                        <BoardCard
                          wo={w}
                          selectable={canAssign}
                          selected={selected.has(w.id)}
                          onToggle={() => toggle(w.id)}
                          onDragStart={() => {
                            setRefused(null);
                            setDragging(w);
                          }}
                          onDragEnd={() => {
                            setDragging(null);
                            setOver(null);
                          }}
                          onMove={() => setPicking(w)}
                        />
                      </li>
                    ))}
                    {cards.length === 0 && <li className="px-1 py-3 text-center text-sm text-graphite-500">Nothing here</li>}
                  </ol>
                </section>
              );
            })}
          </div>
        </div>
      )}

      <PickStageDialog
        wo={picking}
        onClose={() => setPicking(null)}
        onPick={(to) => {
          const w = picking;
          setPicking(null);
          if (w) startMove(w, to);
        }}
      />
      <MoveDialog target={target} onClose={() => setTarget(null)} onMoved={(d) => setNotice(`${d.number} moved to ${STAGE_LABELS[d.stage]}.`)} />
    </div>
  );
}

function BoardCard({
  wo,
  selectable,
  selected,
  onToggle,
  onDragStart,
  onDragEnd,
  onMove,
}: {
  wo: WorkOrderSummary;
  selectable: boolean;
  selected: boolean;
  onToggle: () => void;
  onDragStart: () => void;
  onDragEnd: () => void;
  onMove: () => void;
}) {
  const movable = (wo.allowedMoves ?? []).length > 0;
  // Late: a cut corner and a heavy red edge; at risk: a dashed edge. Plus the words in DueFlags.
  const edge = wo.late ? 'border-l-[6px] border-l-fault' : wo.atRisk ? 'border-l-[6px] border-l-caution border-dashed' : 'border-l-[6px] border-l-graphite-300';
  return (
    <article
      data-card={wo.number}
      data-late={wo.late || undefined}
      data-at-risk={wo.atRisk || undefined}
      draggable={movable}
      onDragStart={(e) => {
        e.dataTransfer.setData('text/plain', wo.number);
        e.dataTransfer.effectAllowed = 'move';
        onDragStart();
      }}
      onDragEnd={onDragEnd}
      style={wo.late ? { clipPath: 'polygon(0 0, calc(100% - 18px) 0, 100% 18px, 100% 100%, 0 100%)' } : undefined}
      className={`relative rounded-md border border-graphite-300 bg-white shadow-sm ${edge} ${selected ? 'ring-4 ring-copper-400' : ''} ${movable ? 'cursor-grab active:cursor-grabbing' : ''}`}
    >
      {wo.late && <span aria-hidden className="absolute top-0 right-0 size-[18px] bg-fault" style={{ clipPath: 'polygon(0 0, 100% 100%, 0 100%)' }} />}
      <div className="flex items-start gap-1 p-2 pb-1">
        {selectable && (
          <label className="-m-1 flex size-11 shrink-0 cursor-pointer items-center justify-center rounded hover:bg-graphite-100">
            <input type="checkbox" checked={selected} onChange={onToggle} className="size-6 accent-copper-600" aria-label={`Select ${wo.number}`} />
          </label>
        )}
        <div className="min-w-0 flex-1">
          <Link to={`/work-orders/${wo.id}`} className="text-lg leading-tight font-bold text-graphite-950 underline-offset-2 hover:underline" draggable={false}>
            {wo.number}
          </Link>
          <p className="truncate text-sm font-semibold text-graphite-800" title={wo.order.customer.name}>
            {wo.order.customer.name}
          </p>
        </div>
      </div>
      <div className="flex flex-col gap-1 px-2 pb-2 text-sm text-graphite-700">
        <p className="line-clamp-2 text-graphite-900" title={wo.line.title}>
          {wo.line.title}
        </p>
        <p className="tabular-nums">
          <span className="font-semibold">×{wo.quantity}</span> · due {formatDay(wo.dueDate)}
        </p>
        <div className="flex flex-wrap items-center gap-1">
          <DueFlags wo={wo} />
          {wo.priority > 0 && (
            <span className="inline-flex items-center gap-1 rounded-sm border border-graphite-800 px-1.5 py-0.5 text-sm font-bold text-graphite-900">
              <span aria-hidden>{'▲'.repeat(wo.priority)}</span>
              {priorityLabel(wo.priority)}
            </span>
          )}
        </div>
        <p>
          <span className="text-graphite-500">Who </span>
          <span data-field="assignee" className="font-semibold text-graphite-900">
            {wo.assignee ? wo.assignee.name : 'Nobody'}
          </span>
        </p>
        <p>
          <span className="text-graphite-500">Station </span>
          <span data-field="station" className="font-semibold text-graphite-900">
            {wo.station ? wo.station.name : 'None'}
          </span>
        </p>
        <p className="text-graphite-600">
          In stage {ageSince(wo.enteredStageAt)} · {hours(wo.estimatedHours)} left
        </p>
        {wo.stage === 'on_hold' && (
          <p className="flex gap-1.5 rounded border border-caution/40 bg-caution-soft px-2 py-1 text-graphite-900" data-testid="hold-reason">
            <HoldIcon className="mt-0.5 size-3.5 text-caution" />
            <span>
              <span className="font-semibold">Held: </span>
              {wo.holdReason || 'no reason recorded'}
            </span>
          </p>
        )}
        {movable && (
          <Button size="md" variant="secondary" className="mt-1 h-11 w-full" onClick={onMove} aria-label={`Move ${wo.number}`}>
            Move…
          </Button>
        )}
      </div>
    </article>
  );
}

/** The touch way to move (no dragging): big buttons for each stage the rules allow. */
function PickStageDialog({ wo, onClose, onPick }: { wo: WorkOrderSummary | null; onClose: () => void; onPick: (to: Stage) => void }) {
  return (
    <Dialog open={wo !== null} title={wo ? `Move ${wo.number} (now ${STAGE_LABELS[wo.stage]})` : 'Move'} onClose={onClose}>
      {wo && (
        <div className="grid grid-cols-2 gap-2">
          {(wo.allowedMoves ?? []).map((to) => {
            const dir = moveDirection(wo.stage, to);
            return (
              <Button key={to} size="lg" variant={dir === 'forward' ? 'primary' : 'secondary'} onClick={() => onPick(to)} className="h-14 justify-start">
                <span aria-hidden>{dir === 'forward' ? '→' : dir === 'back' ? '←' : '↷'}</span>
                {STAGE_LABELS[to]}
              </Button>
            );
          })}
        </div>
      )}
    </Dialog>
  );
}

/** Reassign the selected cards to a person and/or a station, with the versions the foreman saw. */
function AssignBar({ cards, onClear }: { cards: WorkOrderSummary[]; onClear: () => void }) {
  const people = useQuery(floorPeopleQuery());
  const stations = useQuery(stationsQuery(true));
  const assign = useAssignWorkOrders();
  const [person, setPerson] = useState('');
  const [station, setStation] = useState('');
  const [done, setDone] = useState<string | null>(null);
  const n = cards.length;
  const nothingPicked = person === '' && station === '';

  const submit = () => {
    setDone(null);
    const pick = (v: string) => (v === '' ? undefined : v === NONE ? null : Number(v));
    assign.mutate(
      { ids: cards.map((c) => c.id), versions: cards.map((c) => c.version), assigneeId: pick(person), stationId: pick(station) },
      {
        onSuccess: (list) => {
          setDone(`${plural(list.length, 'work order')} reassigned: ${list.map((w) => w.number).join(', ')}.`);
          setPerson('');
          setStation('');
          onClear();
        },
      },
    );
  };

  return (
    <section aria-label="Reassign" data-testid="assign-bar" className={`flex flex-col gap-2 rounded-lg border-2 p-3 ${n ? 'border-copper-400 bg-copper-50' : 'border-graphite-200 bg-white'}`}>
      <div className="flex flex-wrap items-end gap-3">
        <p className="min-w-40 self-center text-lg font-bold text-graphite-900" aria-live="polite">
          {n ? `${plural(n, 'card')} selected` : 'Tick cards to reassign them'}
        </p>
        <SelectField label="Assign to person" value={person} onChange={(e) => setPerson(e.target.value)} disabled={!n} wrapperClassName="min-w-48" className="h-12">
          <option value="">Keep as is</option>
          <option value={NONE}>Nobody (unassign)</option>
          {(people.data ?? []).map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Assign to station" value={station} onChange={(e) => setStation(e.target.value)} disabled={!n} wrapperClassName="min-w-48" className="h-12">
          <option value="">Keep as is</option>
          <option value={NONE}>No station</option>
          {(stations.data ?? []).map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </SelectField>
        <Button variant="primary" size="lg" disabled={!n || nothingPicked} busy={assign.isPending} onClick={submit}>
          Reassign {n ? plural(n, 'card') : ''}
        </Button>
        {n > 0 && (
          <Button variant="quiet" size="lg" onClick={onClear}>
            Clear selection
          </Button>
        )}
      </div>
      <WriteError error={assign.error} what="Nothing was reassigned" />
      {done && (
        <Alert kind="good" title="Reassigned">
          {done}
        </Alert>
      )}
    </section>
  );
}
