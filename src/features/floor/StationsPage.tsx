/**
 * Stations (admin): winding machines, benches, ovens and test benches. A table of every station
 * and a form to create or change one (a station is retired with "active" off, never deleted).
 * Wire range is entered in the user's length unit and stored in metres; set-up time in minutes,
 * stored in seconds.
 */
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState, type FormEvent } from 'react';
import { STATION_KINDS, STATION_KIND_LABELS, type CreateStationBody, type StationKind, type StationRecord } from '../../contracts/floor';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Dialog } from '../../components/Dialog';
import { SelectField, TextField } from '../../components/Field';
import { Loading, PageHeader } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { errorMessage, isApiError } from '../../lib/api';
import { useUnits } from '../../lib/session';
import { formatNumber, fromMetres, toMetres, type UnitFormatters } from '../../lib/units';
import { stationsQuery, useCreateStation, useUpdateStation } from './api';

const col = createColumnHelper<StationRecord>();

function wireRange(s: StationRecord, u: UnitFormatters): string {
  if (s.wireDiameterMin === null && s.wireDiameterMax === null) return 'any';
  const f = (m: number | null) => (m === null ? '…' : u.length(m, u.prefs.lengthUnit === 'mm' ? 2 : 4));
  return `${f(s.wireDiameterMin)} – ${f(s.wireDiameterMax)}`;
}

export function StationsPage() {
  const u = useUnits();
  const stations = useQuery(stationsQuery(false));
  const [editing, setEditing] = useState<StationRecord | 'new' | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Name',
        cell: (c) => (
          <button type="button" className="font-semibold text-copper-700 underline-offset-2 hover:underline" onClick={() => setEditing(c.row.original)}>
            {c.getValue()}
          </button>
        ),
      }),
      col.accessor((s) => STATION_KIND_LABELS[s.kind], { id: 'kind', header: 'Kind', meta: { filter: 'select' } }),
      col.accessor((s) => wireRange(s, u), { id: 'wire', header: `Wire (bare ⌀)` }),
      col.accessor((s) => s.spindleRpm ?? '', {
        id: 'spindle',
        header: 'Spindle',
        cell: (c) => (c.row.original.spindleRpm === null ? '—' : `${formatNumber(c.row.original.spindleRpm, 0)} rev/min`),
        meta: { align: 'right' },
      }),
      col.accessor((s) => s.setupSeconds / 60, { id: 'setup', header: 'Set-up', cell: (c) => `${formatNumber(c.getValue(), 0)} min`, meta: { align: 'right' } }),
      col.accessor((s) => (s.active ? 'Active' : 'Retired'), {
        id: 'active',
        header: 'Status',
        cell: (c) => <StatusBadge kind={c.row.original.active ? 'good' : 'idle'}>{c.getValue()}</StatusBadge>,
        meta: { filter: 'select' },
      }),
    ],
    [u],
  );

  return (
    <div className="flex flex-col gap-4">
      <PageHeader
        title="Stations"
        lead="Winding machines and benches the floor assigns work to. The load view's winding time uses each winder's spindle speed and set-up time."
        actions={
          <Button variant="primary" onClick={() => setEditing('new')}>
            New station
          </Button>
        }
      />
      {notice && <Alert kind="good">{notice}</Alert>}
      {stations.isPending ? (
        <Loading what="Loading stations" />
      ) : stations.isError ? (
        <Alert title="Could not load the stations">{errorMessage(stations.error)}</Alert>
      ) : (
        <DataTable data={stations.data} columns={columns} noun="station" csvName="spoolwright-stations" caption="Stations" getRowId={(s) => String(s.id)} initialSorting={[{ id: 'name', desc: false }]} />
      )}
      <Dialog open={editing !== null} title={editing === 'new' ? 'New station' : editing ? `Change ${editing.name}` : ''} onClose={() => setEditing(null)} wide>
        {editing !== null && (
          <StationForm
            key={editing === 'new' ? 'new' : editing.id}
            station={editing === 'new' ? null : editing}
            u={u}
            onCancel={() => setEditing(null)}
            onDone={(s, created) => {
              setEditing(null);
              setNotice(`${created ? 'Created' : 'Saved'} ${s.name}.`);
            }}
          />
        )}
      </Dialog>
    </div>
  );
}

function StationForm({ station, u, onCancel, onDone }: { station: StationRecord | null; u: UnitFormatters; onCancel: () => void; onDone: (s: StationRecord, created: boolean) => void }) {
  const unit = u.prefs.lengthUnit;
  const digits = unit === 'mm' ? 3 : 4;
  const show = (m: number | null) => (m === null ? '' : String(Number(fromMetres(m, unit).toFixed(digits))));
  const [name, setName] = useState(station?.name ?? '');
  const [kind, setKind] = useState<StationKind>(station?.kind ?? 'winder');
  const [min, setMin] = useState(show(station?.wireDiameterMin ?? null));
  const [max, setMax] = useState(show(station?.wireDiameterMax ?? null));
  const [rpm, setRpm] = useState(station?.spindleRpm === null || station?.spindleRpm === undefined ? '' : String(station.spindleRpm));
  const [setup, setSetup] = useState(station ? String(station.setupSeconds / 60) : '0');
  const [active, setActive] = useState(station?.active ?? true);
  const [local, setLocal] = useState<Record<string, string>>({});
  const create = useCreateStation();
  const update = useUpdateStation();
  const error = create.error ?? update.error;
  const fields = { ...(isApiError(error) ? error.fields : {}), ...local };

  const num = (s: string) => (s.trim() === '' ? null : Number(s));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const errors: Record<string, string> = {};
    const vMin = num(min);
    const vMax = num(max);
    const vRpm = num(rpm);
    const vSetup = num(setup);
    if (vMin !== null && !(vMin > 0)) errors.wireDiameterMin = 'A diameter above 0';
    if (vMax !== null && !(vMax > 0)) errors.wireDiameterMax = 'A diameter above 0';
    if (vRpm !== null && !(vRpm > 0)) errors.spindleRpm = 'A speed above 0 rev/min';
    if (vSetup === null || !(vSetup >= 0)) errors.setupSeconds = 'Minutes, 0 or more';
    setLocal(errors);
    if (Object.keys(errors).length) return;
    const body: CreateStationBody = {
      name: name.trim(),
      kind,
      wireDiameterMin: vMin === null ? null : toMetres(vMin, unit),
      wireDiameterMax: vMax === null ? null : toMetres(vMax, unit),
      spindleRpm: vRpm,
      setupSeconds: Math.round((vSetup ?? 0) * 60),
      active,
    };
    if (station) update.mutate({ id: station.id, change: body as Required<CreateStationBody> }, { onSuccess: (s) => onDone(s, false) });
    else create.mutate(body, { onSuccess: (s) => onDone(s, true) });
  };

  return (
    <form onSubmit={submit} className="grid gap-3 sm:grid-cols-2" noValidate>
      <TextField label="Name" value={name} onChange={(e) => setName(e.target.value)} error={fields.name} required maxLength={80} />
      <SelectField label="Kind" value={kind} onChange={(e) => setKind(e.target.value as StationKind)} error={fields.kind}>
        {STATION_KINDS.map((k) => (
          <option key={k} value={k}>
            {STATION_KIND_LABELS[k]}
          </option>
        ))}
      </SelectField>
      <TextField label={`Smallest wire, bare ⌀ (${u.lengthSymbol})`} inputMode="decimal" value={min} onChange={(e) => setMin(e.target.value)} error={fields.wireDiameterMin} hint="Empty: no limit" />
      <TextField label={`Largest wire, bare ⌀ (${u.lengthSymbol})`} inputMode="decimal" value={max} onChange={(e) => setMax(e.target.value)} error={fields.wireDiameterMax} hint="Empty: no limit" />
      <TextField
        label="Spindle speed (rev/min)"
        inputMode="decimal"
        value={rpm}
        onChange={(e) => setRpm(e.target.value)}
        error={fields.spindleRpm}
        hint={kind === 'winder' ? 'A winding machine states its spindle speed' : 'Empty for stations without a spindle'}
      />
      <TextField label="Set-up time per work order (min)" inputMode="decimal" value={setup} onChange={(e) => setSetup(e.target.value)} error={fields.setupSeconds} />
      <label className="flex items-center gap-2 font-semibold sm:col-span-2">
        <input type="checkbox" className="size-5 accent-copper-600" checked={active} onChange={(e) => setActive(e.target.checked)} />
        Active (a retired station cannot be assigned)
      </label>
      {error && (
        <div className="sm:col-span-2">
          <Alert title={isApiError(error) && error.status === 409 ? 'Name already used' : 'Not saved'}>{errorMessage(error)}</Alert>
        </div>
      )}
      <div className="flex justify-end gap-2 sm:col-span-2">
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
        <Button variant="primary" type="submit" busy={create.isPending || update.isPending}>
          {station ? 'Save' : 'Create station'}
        </Button>
      </div>
    </form>
  );
}
