/**
 * The form of one stage move: the note a hold, rework or backward move needs, and the winding
 * record (turns counter, spool lot, station) when winding is finished. Used by the board (after a
 * drop or the Move button), the scan station and the work order page. The server judges the move;
 * its 422 rule message and per-field messages show here, and a 409 shows the work order as it is now.
 */
import { useQuery } from '@tanstack/react-query';
import { useId, useState, type FormEvent } from 'react';
import type { MoveWorkOrderBody } from '../../contracts/floor';
import { STAGE_LABELS, type Stage } from '../../contracts/stages';
import type { WorkOrderDetail, WorkOrderSummary } from '../../contracts/work-orders';
import { Button } from '../../components/Button';
import { Dialog } from '../../components/Dialog';
import { SelectField, TextField } from '../../components/Field';
import { isApiError } from '../../lib/api';
import { stationsQuery, useMoveWorkOrder } from './api';
import { WriteError } from './parts';
import { moveWords, needsWindingRecord, noteNeed } from './stageRules';

export type MoveTarget = { wo: Pick<WorkOrderSummary, 'id' | 'number' | 'stage' | 'version' | 'station'>; to: Stage };

/** Whether a move can go straight to the server (no note asked, no winding record). */
export const moveNeedsForm = (from: Stage, to: Stage) => noteNeed(from, to) !== 'optional' || needsWindingRecord(from, to);

export function NoteField({ value, onChange, need, error, id }: { value: string; onChange: (v: string) => void; need: 'reason' | 'required' | 'optional'; error?: string; id?: string }) {
  const auto = useId();
  const fieldId = id ?? auto;
  const label = need === 'reason' ? 'Why is it on hold? (required)' : need === 'required' ? 'Note: why (required)' : 'Note (optional)';
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={fieldId} className="text-sm font-semibold text-graphite-800">
        {label}
      </label>
      <textarea
        id={fieldId}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        rows={3}
        maxLength={1000}
        required={need !== 'optional'}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${fieldId}-msg` : undefined}
        className={`block w-full rounded-md border bg-white px-3 py-2 text-base ${error ? 'border-fault' : 'border-graphite-300'} focus:border-copper-500 focus:ring-2 focus:ring-copper-200 focus:outline-none`}
      />
      {error && (
        <p id={`${fieldId}-msg`} role="alert" className="text-sm font-medium text-fault">
          {error}
        </p>
      )}
    </div>
  );
}

/** Turns counter, spool lot and station: what finishing winding records. */
export function WindingRecordFields({
  turns,
  setTurns,
  lot,
  setLot,
  stationId,
  setStationId,
  fields,
}: {
  turns: string;
  setTurns: (v: string) => void;
  lot: string;
  setLot: (v: string) => void;
  stationId: string;
  setStationId: (v: string) => void;
  fields: Record<string, string>;
}) {
  const stations = useQuery(stationsQuery(true));
  const winders = (stations.data ?? []).filter((s) => s.kind === 'winder');
  const others = (stations.data ?? []).filter((s) => s.kind !== 'winder');
  return (
    <fieldset className="grid gap-3 rounded-md border border-copper-200 bg-copper-50 p-3 sm:grid-cols-3" data-testid="winding-record">
      <legend className="px-1 text-sm font-bold text-copper-800">Winding record</legend>
      <TextField
        label="Turns counter reading"
        inputMode="numeric"
        pattern="[0-9]*"
        value={turns}
        onChange={(e) => setTurns(e.target.value)}
        error={fields.turnsCounter}
        required
        className="h-12 text-lg"
      />
      <TextField label="Spool lot used" value={lot} onChange={(e) => setLot(e.target.value)} error={fields.spoolLot} required className="h-12 text-lg" maxLength={60} />
      <SelectField label="Station" value={stationId} onChange={(e) => setStationId(e.target.value)} error={fields.stationId} required className="h-12 text-lg">
        <option value="">Pick the station…</option>
        {winders.length > 0 && (
          <optgroup label="Winding machines">
            {winders.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </optgroup>
        )}
        {others.length > 0 && (
          <optgroup label="Other stations">
            {others.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </optgroup>
        )}
      </SelectField>
    </fieldset>
  );
}

/** Builds the move body from the form's texts; a bad turns counter answers a message instead. */
export function moveBody(
  target: MoveTarget,
  note: string,
  record: { turns: string; lot: string; stationId: string } | null,
): { body: MoveWorkOrderBody } | { error: Record<string, string> } {
  const body: MoveWorkOrderBody = { to: target.to, version: target.wo.version };
  if (note.trim()) body.note = note.trim();
  if (record) {
    const errors: Record<string, string> = {};
    const t = record.turns.trim();
    if (!/^\d+$/.test(t)) errors.turnsCounter = 'Enter the turns counter reading (a whole number)';
    else body.turnsCounter = Number(t);
    if (!record.lot.trim()) errors.spoolLot = 'Enter the spool lot you wound from';
    else body.spoolLot = record.lot.trim();
    if (!record.stationId) errors.stationId = 'Pick the winding station';
    else body.stationId = Number(record.stationId);
    if (Object.keys(errors).length) return { error: errors };
  }
  return { body };
}

export function MoveDialog({ target, onClose, onMoved }: { target: MoveTarget | null; onClose: () => void; onMoved?: (d: WorkOrderDetail) => void }) {
  return (
    <Dialog open={target !== null} title={target ? `Move ${target.wo.number}: ${moveWords(target.wo.stage, target.to)}` : 'Move'} onClose={onClose} wide>
      {target && <MoveForm key={`${target.wo.id}-${target.to}-${target.wo.version}`} target={target} onClose={onClose} onMoved={onMoved} />}
    </Dialog>
  );
}

function MoveForm({ target, onClose, onMoved }: { target: MoveTarget; onClose: () => void; onMoved?: (d: WorkOrderDetail) => void }) {
  const move = useMoveWorkOrder();
  const need = noteNeed(target.wo.stage, target.to);
  const record = needsWindingRecord(target.wo.stage, target.to);
  const [note, setNote] = useState('');
  const [turns, setTurns] = useState('');
  const [lot, setLot] = useState('');
  const [stationId, setStationId] = useState(target.wo.station ? String(target.wo.station.id) : '');
  const [local, setLocal] = useState<Record<string, string>>({});

  const serverFields = isApiError(move.error) ? move.error.fields : {};
  const fields = { ...serverFields, ...local };
  const conflict = isApiError(move.error) && move.error.status === 409;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const errors: Record<string, string> = {};
    if (need !== 'optional' && !note.trim()) errors.note = need === 'reason' ? 'Say why it is on hold' : 'Say why';
    const built = moveBody(target, note, record ? { turns, lot, stationId } : null);
    if ('error' in built) Object.assign(errors, built.error);
    setLocal(errors);
    if (Object.keys(errors).length || !('body' in built)) return;
    move.mutate(
      { id: target.wo.id, body: built.body },
      {
        onSuccess: (d) => {
          onMoved?.(d);
          onClose();
        },
      },
    );
  };

  return (
    <form onSubmit={submit} className="flex flex-col gap-4" noValidate>
      <p className="text-graphite-700">
        From <strong>{STAGE_LABELS[target.wo.stage]}</strong> to <strong>{STAGE_LABELS[target.to]}</strong>. Every move is kept in the work order's history.
      </p>
      {record && <WindingRecordFields turns={turns} setTurns={setTurns} lot={lot} setLot={setLot} stationId={stationId} setStationId={setStationId} fields={fields} />}
      <NoteField value={note} onChange={setNote} need={need} error={fields.note} />
      <WriteError error={move.error} what="The move was not saved" />
      <div className="flex justify-end gap-2">
        <Button size="lg" variant="quiet" onClick={onClose}>
          {conflict ? 'Close' : 'Cancel'}
        </Button>
        {!conflict && (
          <Button size="lg" variant="primary" type="submit" busy={move.isPending}>
            Move to {STAGE_LABELS[target.to]}
          </Button>
        )}
      </div>
    </form>
  );
}
