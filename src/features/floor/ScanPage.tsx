/**
 * The scan station: a tablet at the bench with a barcode scanner that types like a keyboard.
 * The scan field keeps the focus (after every action and whenever it loses it to nothing), so a
 * scan — the work order number and Enter — always lands there. The job opens with one large
 * button to move it on one stage; finishing winding asks for the turns counter, the spool lot and
 * the station. A mistake is undone by a reverse move with a note (the history keeps both).
 */
import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { STAGE_LABELS, type Stage } from '../../contracts/stages';
import type { WorkOrderDetail } from '../../contracts/work-orders';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { Loading } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { formatDay, formatDateTime } from '../../lib/format';
import { useCurrentUser, useUnits } from '../../lib/session';
import { lookupWorkOrder, parseScan, useFloorLive, useMoveWorkOrder, workOrderQuery } from './api';
import { MoveDialog, WindingRecordFields, moveBody, type MoveTarget } from './MoveDialog';
import { BuildEssentials, DueFlags, HipotCaution, StageTag, WriteError, priorityLabel } from './parts';
import { moveWords, needsWindingRecord, nextStage, previousStage } from './stageRules';

type Result = { number: string; from: Stage; to: Stage; at: string; id: number };

/** Whether focus went somewhere the user meant to type or pick (then the scan field lets it go). */
const isFormControl = (el: Element | null) => el instanceof HTMLInputElement || el instanceof HTMLSelectElement || el instanceof HTMLTextAreaElement || Boolean(el?.closest('dialog[open]'));

export function ScanPage() {
  const user = useCurrentUser();
  const u = useUnits();
  const live = useFloorLive();
  const input = useRef<HTMLInputElement>(null);
  const [text, setText] = useState('');
  const [jobId, setJobId] = useState<number | null>(null);
  const [looking, setLooking] = useState(false);
  const [lookupError, setLookupError] = useState<string | null>(null);
  const [result, setResult] = useState<Result | null>(null);
  const [undo, setUndo] = useState<MoveTarget | null>(null);
  const [turns, setTurns] = useState('');
  const [lot, setLot] = useState('');
  const [stationId, setStationId] = useState('');
  const [local, setLocal] = useState<Record<string, string>>({});
  const move = useMoveWorkOrder();
  const job = useQuery({ ...workOrderQuery(jobId ?? 0, live.pollMs), enabled: jobId !== null });
  const wo: WorkOrderDetail | undefined = jobId !== null ? job.data : undefined;

  const focusScan = () => {
    const el = input.current;
    if (el && document.activeElement !== el) el.focus();
  };
  useEffect(() => {
    focusScan();
  }, []);
  // Whenever a dialog closes or a result shows, the scan field takes the focus back.
  useEffect(() => {
    if (!undo) setTimeout(focusScan, 0);
  }, [undo, result, jobId]);

  const open = async (e: FormEvent) => {
    e.preventDefault();
    const target = parseScan(text);
    setText('');
    focusScan();
    if (!target) return;
    setLooking(true);
    setLookupError(null);
    setResult(null);
    move.reset();
    setLocal({});
    try {
      const found = await lookupWorkOrder(target);
      if (!found) {
        setLookupError(`No work order ${'id' in target ? `with id ${target.id}` : target.number}. Check the traveler and scan again.`);
        setJobId(null);
      } else {
        setJobId(found.id);
        setTurns('');
        setLot('');
        setStationId(found.station ? String(found.station.id) : '');
      }
    } catch (err) {
      setLookupError(errorMessage(err));
    } finally {
      setLooking(false);
      focusScan();
    }
  };

  const next = wo ? nextStage(wo.stage) : null;
  const canNext = Boolean(wo && next && wo.allowedMoves?.includes(next));
  const record = Boolean(wo && next && needsWindingRecord(wo.stage, next));

  const advance = () => {
    if (!wo || !next) return;
    const built = moveBody({ wo, to: next }, '', record ? { turns, lot, stationId } : null);
    if ('error' in built) {
      setLocal(built.error);
      return;
    }
    setLocal({});
    move.mutate(
      { id: wo.id, body: built.body },
      {
        onSuccess: (d) => {
          setResult({ number: d.number, from: wo.stage, to: d.stage, at: new Date().toISOString(), id: d.id });
          setTurns('');
          setLot('');
        },
        onSettled: () => setTimeout(focusScan, 0),
      },
    );
  };

  const blocked = (): string | null => {
    if (!wo || canNext) return null;
    if (wo.stage === 'on_hold') return `On hold${wo.holdReason ? `: ${wo.holdReason}` : ''}. The foreman takes it off hold.`;
    if (wo.stage === 'rework') return 'In rework. The foreman sends it back into the flow.';
    if (wo.stage === 'packing' || wo.stage === 'shipped') return `In ${STAGE_LABELS[wo.stage]}: shipping takes it from here.`;
    if (wo.assignee && wo.assignee.id !== user.id && user.role === 'floor') return `Assigned to ${wo.assignee.name}. Ask the foreman to reassign it.`;
    return 'Your role cannot move it on from here.';
  };

  const fields = { ...(isApiError(move.error) ? move.error.fields : {}), ...local };

  return (
    <div data-testid="scan-station" className="flex flex-col gap-5">
      <form onSubmit={open} className="rounded-lg border-2 border-graphite-800 bg-graphite-900 p-4 text-white" role="search">
        <label htmlFor="scan-input" className="block text-lg font-bold">
          Scan a traveler or type a work order number
        </label>
        <div className="mt-2 flex gap-3">
          <input
            id="scan-input"
            ref={input}
            value={text}
            onChange={(e) => setText(e.target.value)}
            onBlur={(e) => {
              if (isFormControl(e.relatedTarget as Element | null)) return;
              setTimeout(() => {
                if (!isFormControl(document.activeElement) || document.activeElement === document.body) focusScan();
              }, 0);
            }}
            autoComplete="off"
            autoCapitalize="characters"
            spellCheck={false}
            enterKeyHint="go"
            placeholder="WO-26-00042"
            className="h-16 min-w-0 flex-1 rounded-md border-2 border-copper-400 bg-white px-4 font-mono text-3xl text-graphite-950 placeholder:text-graphite-300 focus:ring-4 focus:ring-copper-300 focus:outline-none"
          />
          <Button type="submit" variant="primary" size="lg" className="h-16 px-8 text-xl" busy={looking}>
            Open
          </Button>
        </div>
        <p className="mt-2 text-sm text-graphite-300">The field keeps the cursor: scan any time. {live.state === 'polling' ? 'Refreshing every 10 s.' : ''}</p>
      </form>

      {lookupError && (
        <div data-testid="scan-error">
          <Alert title="Not found">{lookupError}</Alert>
        </div>
      )}

      {result && (
        <div data-testid="move-result" className="flex flex-wrap items-center justify-between gap-3 rounded-lg border-2 border-ok bg-ok-soft px-4 py-3">
          <p className="flex items-center gap-2 text-xl font-bold text-graphite-950">
            <svg viewBox="0 0 16 16" className="size-6 text-ok" aria-hidden>
              <circle cx="8" cy="8" r="7" fill="currentColor" />
              <path d="M4.5 8.2 7 10.5l4.5-5" fill="none" stroke="white" strokeWidth="2" strokeLinecap="round" />
            </svg>
            {result.number}: {moveWords(result.from, result.to)}
            <span className="text-base font-normal text-graphite-700">at {formatDateTime(result.at)}</span>
          </p>
          {wo && wo.id === result.id && wo.stage === result.to && previousStage(wo.stage) === result.from && (
            <Button size="lg" variant="secondary" onClick={() => setUndo({ wo, to: result.from })}>
              Undo: back to {STAGE_LABELS[result.from]}
            </Button>
          )}
        </div>
      )}

      {jobId !== null && job.isPending && <Loading what="Opening the job" />}
      {job.error && jobId !== null && <Alert title="Cannot open the job">{errorMessage(job.error)}</Alert>}

      {wo && (
        <section aria-label={`Work order ${wo.number}`} data-testid="scan-job" data-stage={wo.stage} className="flex flex-col gap-4 rounded-lg border border-graphite-300 bg-white p-4">
          <div className="flex flex-wrap items-start justify-between gap-3">
            <div>
              <h1 className="text-4xl font-bold tracking-tight text-graphite-950">
                <Link to={`/work-orders/${wo.id}`} className="underline-offset-4 hover:underline">
                  {wo.number}
                </Link>
              </h1>
              <p className="text-lg text-graphite-800">
                {wo.order.customer.name} · {wo.line.title}
              </p>
              <p className="text-graphite-700">
                ×{wo.quantity} · due {formatDay(wo.dueDate)} · {priorityLabel(wo.priority)} · {wo.assignee ? wo.assignee.name : 'nobody assigned'} ·{' '}
                {wo.station ? wo.station.name : 'no station'}
              </p>
            </div>
            <div className="flex flex-col items-end gap-2">
              <StageTag stage={wo.stage} large />
              <DueFlags wo={wo} large />
            </div>
          </div>

          {(wo.stage === 'testing' || next === 'testing') && <HipotCaution />}

          {wo.buildSheet && <BuildEssentials sheet={wo.buildSheet} u={u} />}

          {record && canNext && (
            <WindingRecordFields turns={turns} setTurns={setTurns} lot={lot} setLot={setLot} stationId={stationId} setStationId={setStationId} fields={fields} />
          )}

          <WriteError error={move.error} what="The move was not saved" />

          {canNext && next ? (
            <Button variant="primary" size="lg" className="h-20 w-full" onClick={advance} busy={move.isPending} data-testid="advance">
              <span className="text-2xl">
                Move to {STAGE_LABELS[next]} <span aria-hidden>→</span>
              </span>
            </Button>
          ) : (
            <Alert kind="idle" title="No next step from this screen">
              {blocked()}
            </Alert>
          )}
        </section>
      )}

      <MoveDialog target={undo} onClose={() => setUndo(null)} onMoved={(d) => setResult({ number: d.number, from: undo?.wo.stage ?? d.stage, to: d.stage, at: new Date().toISOString(), id: d.id })} />
    </div>
  );
}
