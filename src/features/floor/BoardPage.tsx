/**
 * The board: one column per stage the floor works in (ready … packing, then on hold and rework),
 * each headed by its count and estimated hours, its cards in the order the foreman works them
 * (priority, then due date). A column draws only the cards in view and fetches more as it is
 * scrolled, so a shop with thousands of open work orders scrolls as smoothly as one with ten.
 * Three views (cards, compact, list), a search box and filters, all kept in the address so a
 * screen can be bookmarked or put on a wall. The foreman selects cards and reassigns them (all or
 * nothing, with the versions seen), and drags a card to another column to move it. The live feed
 * brings each changed card; a stale version is shown, never overwritten.
 */
import { useQuery } from '@tanstack/react-query';
import { useVirtualizer } from '@tanstack/react-virtual';
import { useEffect, useMemo, useRef, useState, type DragEvent, type ReactNode } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { BoardCard as Card, BoardColumn, BoardFilters } from '../../contracts/board';
import { STAGE_LABELS, type Stage } from '../../contracts/stages';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { Dialog } from '../../components/Dialog';
import { SelectField, TextField } from '../../components/Field';
import { Loading, PageHeader } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { addDaysIso, formatDay, plural, todayIso } from '../../lib/format';
import { useCurrentUser } from '../../lib/session';
import { boardQuery, floorPeopleQuery, loadMoreCards, stationsQuery, useAssignWorkOrders, useFloorLive, useMoveWorkOrder, type LiveState } from './api';
import { MoveDialog, moveNeedsForm, type MoveTarget } from './MoveDialog';
import { DueFlags, HoldIcon, StageTag, WriteError, ageSince, hours, priorityLabel } from './parts';
import { BOARD_STAGES, moveDirection } from './stageRules';

type DueWindow = 'all' | 'late' | '3' | '7' | '14';
type View = 'cards' | 'compact' | 'list';
const VIEWS: { id: View; label: string }[] = [
  { id: 'cards', label: 'Cards' },
  { id: 'compact', label: 'Compact' },
  { id: 'list', label: 'List' },
];
/** "none" in a person / station filter: nobody or no station assigned. */
const NONE = 'none';
const SIDE: readonly Stage[] = ['on_hold', 'rework'];

/** The board's state as the address keeps it: filters, search and view. */
function useBoardParams() {
  const [params, setParams] = useSearchParams();
  const get = (k: string) => params.get(k) ?? '';
  const view = (VIEWS.some((v) => v.id === get('view')) ? get('view') : 'cards') as View;
  const due = (['late', '3', '7', '14'].includes(get('due')) ? get('due') : 'all') as DueWindow;
  const set = (changes: Record<string, string>) =>
    setParams(
      (p) => {
        const n = new URLSearchParams(p);
        for (const [k, v] of Object.entries(changes)) {
          if (v === '' || (k === 'due' && v === 'all') || (k === 'view' && v === 'cards')) n.delete(k);
          else n.set(k, v);
        }
        return n;
      },
      { replace: true },
    );
  return { station: get('station'), person: get('person'), customer: get('customer'), due, q: get('q'), view, set };
}

const idOrNone = (v: string) => (v === '' ? undefined : v === NONE ? ('none' as const) : Number(v));

export function LiveBadge({ state }: { state: LiveState }) {
  const words = state === 'live' ? 'Live' : state === 'polling' ? 'Refreshing every 10 s' : 'Connecting…';
  return (
    <span data-live={state} className="inline-flex items-center gap-1.5 rounded-full border border-graphite-300 bg-white px-3 py-1 text-sm font-semibold text-graphite-700">
      <span aria-hidden className={`size-2.5 ${state === 'live' ? 'rounded-full bg-ok' : state === 'polling' ? 'rotate-45 bg-caution' : 'rounded-full border-2 border-graphite-400'}`} />
      {words}
    </span>
  );
}

/** What a card offers its column: selection, dragging and the touch way to move. */
type CardActions = {
  selectable: boolean;
  selected: Set<number>;
  onToggle: (id: number) => void;
  onDragStart: (w: Card) => void;
  onDragEnd: () => void;
  onMove: (w: Card) => void;
};

export function BoardPage() {
  const user = useCurrentUser();
  const canAssign = user.role === 'foreman' || user.role === 'admin';
  const live = useFloorLive();
  const p = useBoardParams();
  const today = todayIso();
  const filters: BoardFilters = useMemo(
    () => ({
      station: idOrNone(p.station),
      assignee: idOrNone(p.person),
      customer: p.customer ? Number(p.customer) : undefined,
      late: p.due === 'late' ? true : undefined,
      dueTo: p.due !== 'all' && p.due !== 'late' ? addDaysIso(today, Number(p.due)) : undefined,
      q: p.q.trim() || undefined,
    }),
    [p.station, p.person, p.customer, p.due, p.q, today],
  );
  const board = useQuery(boardQuery(filters, live.pollMs));
  const [selected, setSelected] = useState<Set<number>>(new Set());
  const [dragging, setDragging] = useState<Card | null>(null);
  const [over, setOver] = useState<Stage | null>(null);
  const [target, setTarget] = useState<MoveTarget | null>(null);
  const [picking, setPicking] = useState<Card | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [refused, setRefused] = useState<string | null>(null);
  const [opened, setOpened] = useState<Set<Stage>>(new Set());
  const quickMove = useMoveWorkOrder();

  const columns = board.data?.columns ?? [];
  const loaded = columns.flatMap((c) => c.cards);
  const total = columns.reduce((t, c) => t + c.count, 0);
  const choices = board.data?.choices ?? { people: [], stations: [], customers: [] };
  // Selected cards that are still on the board (a card another user moved off drops out).
  const selectedCards = loaded.filter((w) => selected.has(w.id));
  const filtered = p.station !== '' || p.person !== '' || p.customer !== '' || p.due !== 'all' || p.q !== '';

  const toggle = (id: number) =>
    setSelected((s) => {
      const n = new Set(s);
      if (n.has(id)) n.delete(id);
      else n.add(id);
      return n;
    });

  /** A move chosen by drop or by the Move button: ask for what it needs, or send it at once. */
  const startMove = (wo: Card, to: Stage) => {
    setNotice(null);
    quickMove.reset();
    if (moveNeedsForm(wo.stage, to)) {
      setTarget({ wo, to });
      return;
    }
    quickMove.mutate({ id: wo.id, body: { to, version: wo.version } }, { onSuccess: (d) => setNotice(`${d.number} moved to ${STAGE_LABELS[d.stage]}.`) });
  };

  const onDrop = (e: DragEvent, stage: Stage) => {
    e.preventDefault();
    setOver(null);
    const wo = dragging;
    setDragging(null);
    if (!wo || wo.stage === stage) return;
    if (!wo.allowedMoves.includes(stage)) {
      setNotice(null);
      quickMove.reset();
      setRefused(`${wo.number} cannot go from ${STAGE_LABELS[wo.stage]} to ${STAGE_LABELS[stage]} — the move rules do not allow it for your role.`);
      return;
    }
    startMove(wo, stage);
  };

  const actions: CardActions = {
    selectable: canAssign,
    selected,
    onToggle: toggle,
    onDragStart: (w) => {
      setRefused(null);
      setDragging(w);
    },
    onDragEnd: () => {
      setDragging(null);
      setOver(null);
    },
    onMove: (w) => setPicking(w),
  };

  const more = (c: BoardColumn) => (c.nextCursor ? loadMoreCards(filters, c.stage, c.nextCursor) : Promise.resolve());

  return (
    <div data-testid="board" className="flex flex-col gap-3">
      <PageHeader
        title="Board"
        lead="Every work order on the floor, by stage, most urgent first. Drag a card to move it; tick cards to reassign them."
        actions={<LiveBadge state={live.state} />}
      />

      <div className="flex flex-wrap items-end gap-3 rounded-lg border border-graphite-200 bg-white p-3" role="group" aria-label="Filters">
        <SearchBox value={p.q} onChange={(q) => p.set({ q })} />
        <SelectField label="Station" value={p.station} onChange={(e) => p.set({ station: e.target.value })} wrapperClassName="min-w-36" className="h-12">
          <option value="">Every station</option>
          <option value={NONE}>No station</option>
          {choices.stations.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Person" value={p.person} onChange={(e) => p.set({ person: e.target.value })} wrapperClassName="min-w-36" className="h-12">
          <option value="">Everyone</option>
          <option value={NONE}>Nobody assigned</option>
          {choices.people.map((x) => (
            <option key={x.id} value={x.id}>
              {x.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Customer" value={p.customer} onChange={(e) => p.set({ customer: e.target.value })} wrapperClassName="min-w-40" className="h-12">
          <option value="">Every customer</option>
          {choices.customers.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Due" value={p.due} onChange={(e) => p.set({ due: e.target.value })} wrapperClassName="min-w-36" className="h-12">
          <option value="all">Any date</option>
          <option value="late">Late only</option>
          <option value="3">Within 3 days</option>
          <option value="7">Within 7 days</option>
          <option value="14">Within 14 days</option>
        </SelectField>
        {filtered && (
          <Button variant="quiet" size="lg" onClick={() => p.set({ station: '', person: '', customer: '', due: 'all', q: '' })}>
            Clear filters
          </Button>
        )}
        <div className="ml-auto flex flex-col items-end gap-1">
          <div role="radiogroup" aria-label="View" className="flex overflow-hidden rounded-md border border-graphite-300">
            {VIEWS.map((v) => (
              <button
                key={v.id}
                type="button"
                role="radio"
                aria-checked={p.view === v.id}
                onClick={() => p.set({ view: v.id })}
                className={`h-11 px-3 text-sm font-semibold ${p.view === v.id ? 'bg-graphite-800 text-white' : 'bg-white text-graphite-700 hover:bg-graphite-100'}`}
              >
                {v.label}
              </button>
            ))}
          </div>
          <p className="text-sm text-graphite-600 tabular-nums" aria-live="polite" data-testid="board-total">
            {plural(total, 'work order')}
            {filtered ? ' match' : ' open'}
          </p>
        </div>
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
      ) : p.view === 'list' ? (
        <ListView columns={columns} actions={actions} onMore={more} />
      ) : (
        <div className="-mx-4 overflow-x-auto px-4 pb-2" data-testid="board-columns">
          <div
            className="grid gap-1.5"
            style={{
              gridTemplateColumns: columns.map((c) => (isCollapsed(c, opened) ? '2.5rem' : 'minmax(9rem, 1fr)')).join(' '),
            }}
          >
            {columns.map((c) => {
              const canDrop = dragging !== null && dragging.stage !== c.stage && dragging.allowedMoves.includes(c.stage);
              const dropProps = {
                onDragOver: (e: DragEvent) => {
                  if (!dragging) return;
                  e.preventDefault();
                  e.dataTransfer.dropEffect = canDrop ? 'move' : 'none';
                  if (over !== c.stage) setOver(c.stage);
                },
                onDragLeave: (e: DragEvent) => {
                  if (!e.currentTarget.contains(e.relatedTarget as Node | null)) setOver((o) => (o === c.stage ? null : o));
                },
                onDrop: (e: DragEvent) => onDrop(e, c.stage),
              };
              const frame = dragging && over === c.stage ? (canDrop ? 'border-copper-500 bg-copper-50' : 'border-fault/50 bg-fault-soft') : '';
              const hint = dragging && canDrop && over !== c.stage ? 'outline-2 outline-offset-[-2px] outline-copper-300 outline-dashed' : '';
              if (isCollapsed(c, opened)) {
                return (
                  <CollapsedColumn
                    key={c.stage}
                    column={c}
                    extra={`${frame} ${hint}`}
                    dropProps={dropProps}
                    onOpen={() => setOpened((s) => new Set(s).add(c.stage))}
                  />
                );
              }
              return (
                <Column
                  key={c.stage}
                  column={c}
                  view={p.view}
                  actions={actions}
                  onMore={() => more(c)}
                  extra={`${frame} ${hint}`}
                  dropProps={dropProps}
                  onClose={SIDE.includes(c.stage) || c.count === 0 ? () => setOpened((s) => { const n = new Set(s); n.delete(c.stage); return n; }) : undefined}
                />
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

/**
 * Side states and empty stages start folded into a narrow strip (every stage stays in sight at
 * 1366 px); a click opens one. A folded strip takes a dropped card too (nothing changes width
 * while a card is dragged, so the drop lands where it was aimed).
 */
function isCollapsed(c: BoardColumn, opened: Set<Stage>) {
  if (opened.has(c.stage)) return false;
  return SIDE.includes(c.stage) || c.count === 0;
}

/** Search as you type (after a short pause), kept in the address. */
function SearchBox({ value, onChange }: { value: string; onChange: (q: string) => void }) {
  const [text, setText] = useState(value);
  const last = useRef(value);
  useEffect(() => {
    // The address changed from elsewhere (Clear filters, back button): show it.
    if (value !== last.current) setText(value);
    last.current = value;
  }, [value]);
  useEffect(() => {
    if (text === value) return;
    const t = setTimeout(() => {
      last.current = text;
      onChange(text);
    }, 300);
    return () => clearTimeout(t);
  }, [text, value, onChange]);
  return (
    <TextField
      label="Search"
      type="search"
      value={text}
      placeholder="Number, customer, order or title"
      onChange={(e) => setText(e.target.value)}
      wrapperClassName="min-w-56 flex-1"
      className="h-12"
      maxLength={60}
    />
  );
}

type DropProps = { onDragOver: (e: DragEvent) => void; onDragLeave: (e: DragEvent) => void; onDrop: (e: DragEvent) => void };

function ColumnHead({ column: c, side, children }: { column: BoardColumn; side: boolean; children?: ReactNode }) {
  return (
    <header className={`flex items-start justify-between gap-1 rounded-t-md px-2.5 py-2 ${side ? 'bg-graphite-200' : 'bg-graphite-800 text-white'}`}>
      <div className="min-w-0">
        <h2 className="flex items-center gap-1.5 text-base leading-tight font-bold">
          {c.stage === 'on_hold' && <HoldIcon />}
          {STAGE_LABELS[c.stage]}
        </h2>
        <p className={`text-sm tabular-nums ${side ? 'text-graphite-700' : 'text-graphite-200'}`} data-testid={`column-count-${c.stage}`}>
          {plural(c.count, 'job')} · {hours(c.estimatedHours)}
        </p>
      </div>
      {children}
    </header>
  );
}

function CollapsedColumn({ column: c, extra, dropProps, onOpen }: { column: BoardColumn; extra: string; dropProps: DropProps; onOpen: () => void }) {
  return (
    <section data-column={c.stage} data-collapsed aria-label={`${STAGE_LABELS[c.stage]}: ${plural(c.count, 'work order')}`} {...dropProps} className={`rounded-lg border-2 border-transparent ${extra}`}>
      <button
        type="button"
        onClick={onOpen}
        title={`Open ${STAGE_LABELS[c.stage]}`}
        className="flex h-full min-h-64 w-full flex-col items-center gap-2 rounded-md bg-graphite-200 py-3 text-graphite-800 hover:bg-graphite-300"
      >
        <span className="rounded-full bg-white px-1.5 text-sm font-bold tabular-nums" data-testid={`column-count-${c.stage}`}>
          {c.count}
        </span>
        <span className="text-sm font-bold [writing-mode:vertical-rl]">
          {c.stage === 'on_hold' && <HoldIcon className="mb-1 size-4 rotate-90" />}
          {STAGE_LABELS[c.stage]} · {hours(c.estimatedHours)}
        </span>
      </button>
    </section>
  );
}

/** One stage: its head, and its cards drawn only where the column is scrolled to. */
function Column({
  column: c,
  view,
  actions,
  onMore,
  extra,
  dropProps,
  onClose,
}: {
  column: BoardColumn;
  view: View;
  actions: CardActions;
  onMore: () => Promise<void>;
  extra: string;
  dropProps: DropProps;
  onClose?: () => void;
}) {
  const side = SIDE.includes(c.stage);
  const scroller = useRef<HTMLDivElement>(null);
  const [loading, setLoading] = useState(false);
  const [failed, setFailed] = useState(false);
  const rows = c.cards.length + (c.nextCursor ? 1 : 0);
  const v = useVirtualizer({
    count: rows,
    getScrollElement: () => scroller.current,
    estimateSize: () => (view === 'compact' ? 92 : 230),
    overscan: 6,
    getItemKey: (i) => c.cards[i]?.id ?? `more-${c.stage}`,
  });
  const items = v.getVirtualItems();
  const lastShown = items.length ? items[items.length - 1]!.index : -1;
  // The "more" row came into view: fetch the next page.
  useEffect(() => {
    if (c.nextCursor && lastShown >= c.cards.length && !loading && !failed) {
      setLoading(true);
      onMore()
        .catch(() => setFailed(true))
        .finally(() => setLoading(false));
    }
  }, [lastShown, c.cards.length, c.nextCursor, loading, failed, onMore]);

  return (
    <section
      data-column={c.stage}
      aria-label={`${STAGE_LABELS[c.stage]}: ${plural(c.count, 'work order')}`}
      {...dropProps}
      className={`flex min-w-0 flex-col self-start rounded-lg border-2 transition-colors ${side ? 'border-graphite-300 bg-graphite-100' : 'border-transparent bg-graphite-100'} ${extra}`}
    >
      <ColumnHead column={c} side={side}>
        {onClose && (
          <button type="button" onClick={onClose} className="-m-1 size-9 shrink-0 rounded text-lg leading-none hover:bg-black/10" aria-label={`Fold ${STAGE_LABELS[c.stage]}`}>
            ‹
          </button>
        )}
      </ColumnHead>
      <div ref={scroller} data-testid={`column-scroll-${c.stage}`} className="max-h-[calc(100vh-11rem)] min-h-40 overflow-y-auto overscroll-contain p-1.5" tabIndex={-1}>
        {c.cards.length === 0 && <p className="px-1 py-3 text-center text-sm text-graphite-500">Nothing here</p>}
        <ol className="relative" style={{ height: v.getTotalSize() }}>
          {items.map((item) => {
            const w = c.cards[item.index];
            return (
              <li
                key={item.key}
                data-index={item.index}
                ref={v.measureElement}
                className="absolute top-0 left-0 w-full pb-1.5"
                style={{ transform: `translateY(${item.start}px)` }}
              >
                {w ? (
                  view === 'compact' ? (
                    <CompactCard wo={w} actions={actions} />
                  ) : (
                    <BoardCard wo={w} actions={actions} />
                  )
                ) : (
                  <p className="py-3 text-center text-sm text-graphite-600" data-testid={`column-more-${c.stage}`}>
                    {failed ? (
                      <Button size="md" variant="quiet" onClick={() => setFailed(false)}>
                        Could not load more — try again
                      </Button>
                    ) : (
                      `Loading more… (${c.cards.length} of ${c.count})`
                    )}
                  </p>
                )}
              </li>
            );
          })}
        </ol>
      </div>
    </section>
  );
}

/** Late: a cut corner and a heavy red edge; at risk: a dashed edge. Plus the words in DueFlags. */
const edgeOf = (wo: Card) =>
  wo.late ? 'border-l-[6px] border-l-fault' : wo.atRisk ? 'border-l-[6px] border-l-caution border-dashed' : 'border-l-[6px] border-l-graphite-300';

function dragProps(wo: Card, actions: CardActions) {
  const movable = wo.allowedMoves.length > 0;
  return {
    draggable: movable,
    onDragStart: (e: DragEvent) => {
      e.dataTransfer.setData('text/plain', wo.number);
      e.dataTransfer.effectAllowed = 'move';
      actions.onDragStart(wo);
    },
    onDragEnd: actions.onDragEnd,
  };
}

function SelectBox({ wo, actions }: { wo: Card; actions: CardActions }) {
  if (!actions.selectable) return null;
  return (
    <label className="flex size-11 shrink-0 cursor-pointer items-center justify-center rounded hover:bg-graphite-100">
      <input type="checkbox" checked={actions.selected.has(wo.id)} onChange={() => actions.onToggle(wo.id)} className="size-6 accent-copper-600" aria-label={`Select ${wo.number}`} />
    </label>
  );
}

function PriorityMark({ priority }: { priority: number }) {
  if (priority <= 0) return null;
  return (
    <span className="inline-flex items-center gap-1 rounded-sm border border-graphite-800 px-1.5 py-0.5 text-sm font-bold text-graphite-900">
      <span aria-hidden>{'▲'.repeat(priority)}</span>
      {priorityLabel(priority)}
    </span>
  );
}

function BoardCard({ wo, actions }: { wo: Card; actions: CardActions }) {
  const movable = wo.allowedMoves.length > 0;
  return (
    <article
      data-card={wo.number}
      data-late={wo.late || undefined}
      data-at-risk={wo.atRisk || undefined}
      {...dragProps(wo, actions)}
      style={wo.late ? { clipPath: 'polygon(0 0, calc(100% - 18px) 0, 100% 18px, 100% 100%, 0 100%)' } : undefined}
      className={`relative rounded-md border border-graphite-300 bg-white shadow-sm ${edgeOf(wo)} ${actions.selected.has(wo.id) ? 'ring-4 ring-copper-400' : ''} ${movable ? 'cursor-grab active:cursor-grabbing' : ''}`}
    >
      {wo.late && <span aria-hidden className="absolute top-0 right-0 size-[18px] bg-fault" style={{ clipPath: 'polygon(0 0, 100% 100%, 0 100%)' }} />}
      <div className="p-2 pb-1">
        <div className="min-w-0 pr-3">
          <Link to={`/work-orders/${wo.id}`} className="block text-base leading-tight font-bold whitespace-nowrap text-graphite-950 underline-offset-2 hover:underline" draggable={false}>
            {wo.number}
          </Link>
          <p className="truncate text-sm font-semibold text-graphite-800" title={wo.customer.name}>
            {wo.customer.name}
          </p>
        </div>
      </div>
      <div className="flex flex-col gap-1 px-2 pb-2 text-sm text-graphite-700">
        <p className="line-clamp-2 text-graphite-900" title={wo.title}>
          {wo.title}
        </p>
        <p className="tabular-nums">
          <span className="font-semibold">×{wo.quantity}</span> · due {formatDay(wo.dueDate)}
        </p>
        <div className="flex flex-wrap items-center gap-1">
          <DueFlags wo={wo} />
          <PriorityMark priority={wo.priority} />
        </div>
        <p className="truncate">
          <span className="text-graphite-500">Who </span>
          <span data-field="assignee" className="font-semibold text-graphite-900">
            {wo.assignee ? wo.assignee.name : 'Nobody'}
          </span>
        </p>
        <p className="truncate">
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
        {(movable || actions.selectable) && (
          <div className="mt-1 flex items-center gap-1.5">
            <SelectBox wo={wo} actions={actions} />
            {movable && (
              <Button size="md" variant="secondary" className="h-11 min-w-0 flex-1" onClick={() => actions.onMove(wo)} aria-label={`Move ${wo.number}`}>
                Move…
              </Button>
            )}
          </div>
        )}
      </div>
    </article>
  );
}

const dayMonth = new Intl.DateTimeFormat('en-GB', { day: '2-digit', month: 'short', timeZone: 'UTC' });
/** "24 Nov": a due date without its year, where a column is narrow. */
const shortDay = (iso: string) => dayMonth.format(new Date(`${iso}T00:00:00Z`));

/** A small card: number and priority; customer; due date with its flag and the move button; who. */
function CompactCard({ wo, actions }: { wo: Card; actions: CardActions }) {
  const movable = wo.allowedMoves.length > 0;
  return (
    <article
      data-card={wo.number}
      data-late={wo.late || undefined}
      data-at-risk={wo.atRisk || undefined}
      {...dragProps(wo, actions)}
      style={wo.late ? { clipPath: 'polygon(0 0, calc(100% - 12px) 0, 100% 12px, 100% 100%, 0 100%)' } : undefined}
      className={`rounded-md border border-graphite-300 bg-white py-1 pr-1 pl-1.5 text-sm leading-snug shadow-sm ${edgeOf(wo)} ${actions.selected.has(wo.id) ? 'ring-4 ring-copper-400' : ''} ${movable ? 'cursor-grab active:cursor-grabbing' : ''}`}
    >
      <p className="flex min-w-0 items-center gap-1">
        {actions.selectable && (
          <input type="checkbox" checked={actions.selected.has(wo.id)} onChange={() => actions.onToggle(wo.id)} className="size-5 shrink-0 accent-copper-600" aria-label={`Select ${wo.number}`} />
        )}
        <Link to={`/work-orders/${wo.id}`} className="truncate font-bold text-graphite-950 underline-offset-2 hover:underline" draggable={false}>
          {wo.number}
        </Link>
        {wo.priority > 0 && (
          <span className="shrink-0 text-xs font-bold text-graphite-900" title={priorityLabel(wo.priority)}>
            {'▲'.repeat(wo.priority)}
          </span>
        )}
      </p>
      <p className="truncate text-graphite-700" title={`${wo.customer.name} — ${wo.title}`}>
        {wo.customer.name}
      </p>
      <div className="flex items-center gap-1">
        <p className="min-w-0 flex-1 truncate text-graphite-600 tabular-nums" title={`Due ${formatDay(wo.dueDate)}`}>
          {shortDay(wo.dueDate)}{' '}
          {wo.late ? (
            <span data-flag="late" className="rounded-sm bg-fault px-1 text-xs font-bold text-white uppercase">
              Late
            </span>
          ) : wo.atRisk ? (
            <span data-flag="at-risk" className="rounded-sm border border-dashed border-caution px-1 text-xs font-bold text-caution">
              At risk
            </span>
          ) : null}
        </p>
        {movable && (
          <Button size="md" variant="quiet" className="h-8 w-9 shrink-0 px-0" onClick={() => actions.onMove(wo)} aria-label={`Move ${wo.number}`}>
            <span aria-hidden>⇢</span>
          </Button>
        )}
      </div>
      <p className="truncate text-graphite-600">
        <span data-field="assignee">{wo.assignee ? wo.assignee.name : 'Nobody'}</span>
      </p>
    </article>
  );
}

type ListRow = { kind: 'head'; column: BoardColumn } | { kind: 'card'; wo: Card } | { kind: 'more'; column: BoardColumn };

/** Every column one under another as dense rows, drawn only where the list is scrolled to. */
function ListView({ columns, actions, onMore }: { columns: BoardColumn[]; actions: CardActions; onMore: (c: BoardColumn) => Promise<void> }) {
  const scroller = useRef<HTMLDivElement>(null);
  const [loading, setLoading] = useState<Stage | null>(null);
  const rows = useMemo<ListRow[]>(
    () =>
      columns.flatMap((c) => [
        { kind: 'head' as const, column: c },
        ...c.cards.map((wo) => ({ kind: 'card' as const, wo })),
        ...(c.nextCursor ? [{ kind: 'more' as const, column: c }] : []),
      ]),
    [columns],
  );
  const v = useVirtualizer({ count: rows.length, getScrollElement: () => scroller.current, estimateSize: (i) => (rows[i]?.kind === 'head' ? 44 : 48), overscan: 10 });
  return (
    <div ref={scroller} data-testid="board-list" className="max-h-[calc(100vh-13rem)] overflow-auto rounded-lg border border-graphite-200 bg-white">
      <div role="table" aria-label="Work orders by stage" className="relative min-w-[56rem]" style={{ height: v.getTotalSize() }}>
        {v.getVirtualItems().map((item) => {
          const r = rows[item.index]!;
          const style = { transform: `translateY(${item.start}px)` };
          if (r.kind === 'head') {
            return (
              <div key={item.key} role="row" data-list-head={r.column.stage} className="absolute top-0 left-0 flex h-11 w-full items-center gap-3 bg-graphite-800 px-3 text-white" style={style}>
                <span role="columnheader" className="font-bold">
                  {STAGE_LABELS[r.column.stage]}
                </span>
                <span className="text-sm text-graphite-200 tabular-nums" data-testid={`column-count-${r.column.stage}`}>
                  {plural(r.column.count, 'job')} · {hours(r.column.estimatedHours)}
                </span>
              </div>
            );
          }
          if (r.kind === 'more') {
            const c = r.column;
            return (
              <div key={item.key} role="row" className="absolute top-0 left-0 flex h-12 w-full items-center px-3" style={style}>
                <Button
                  size="md"
                  variant="quiet"
                  busy={loading === c.stage}
                  onClick={() => {
                    setLoading(c.stage);
                    void onMore(c).finally(() => setLoading(null));
                  }}
                >
                  Show more {STAGE_LABELS[c.stage]} ({c.cards.length} of {c.count})
                </Button>
              </div>
            );
          }
          const wo = r.wo;
          return (
            <div
              key={item.key}
              role="row"
              data-card={wo.number}
              className={`absolute top-0 left-0 grid h-12 w-full items-center gap-2 border-b border-graphite-100 px-2 text-sm ${actions.selected.has(wo.id) ? 'bg-copper-50' : ''}`}
              style={{ ...style, gridTemplateColumns: '2.75rem 8.5rem minmax(8rem,1fr) minmax(8rem,1.3fr) 3.5rem 6.5rem 5.5rem 8rem 4rem 2.75rem' }}
            >
              <span role="cell">
                <SelectBox wo={wo} actions={actions} />
              </span>
              <span role="cell" className="truncate font-bold">
                <Link to={`/work-orders/${wo.id}`} className="underline-offset-2 hover:underline">
                  {wo.number}
                </Link>
              </span>
              <span role="cell" className="truncate" title={wo.customer.name}>
                {wo.customer.name}
              </span>
              <span role="cell" className="truncate text-graphite-700" title={wo.title}>
                {wo.title}
              </span>
              <span role="cell" className="tabular-nums">
                ×{wo.quantity}
              </span>
              <span role="cell" className="tabular-nums">
                {formatDay(wo.dueDate)}
              </span>
              <span role="cell">
                <DueFlags wo={wo} />
              </span>
              <span role="cell" className="truncate" data-field="assignee">
                {wo.assignee ? wo.assignee.name : 'Nobody'}
              </span>
              <span role="cell" className="text-right tabular-nums">
                {hours(wo.estimatedHours)}
              </span>
              <span role="cell">
                {wo.allowedMoves.length > 0 && (
                  <Button size="md" variant="quiet" className="size-11 px-0" onClick={() => actions.onMove(wo)} aria-label={`Move ${wo.number}`}>
                    <span aria-hidden>⇢</span>
                  </Button>
                )}
              </span>
            </div>
          );
        })}
      </div>
    </div>
  );
}

/** The touch way to move (no dragging): big buttons for each stage the rules allow. */
function PickStageDialog({ wo, onClose, onPick }: { wo: Card | null; onClose: () => void; onPick: (to: Stage) => void }) {
  return (
    <Dialog open={wo !== null} title={wo ? `Move ${wo.number} (now ${STAGE_LABELS[wo.stage]})` : 'Move'} onClose={onClose}>
      {wo && (
        <div className="grid grid-cols-2 gap-2">
          {wo.allowedMoves.map((to) => {
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
      {wo && <StageTag stage={wo.stage} />}
    </Dialog>
  );
}

/** Reassign the selected cards to a person and/or a station, with the versions the foreman saw. */
function AssignBar({ cards, onClear }: { cards: Card[]; onClear: () => void }) {
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
