/** Receiving a spool into stock (office, engineer, admin). The contract's schema checks it first; the server again. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { AWG_GAUGE_MAX, AWG_GAUGE_MIN, METRIC_NOMINAL_DIAMETERS_MM } from '../../contracts/coil';
import { receiveSpoolRequest, SPOOL_MASS_MAX_KG, type SpoolRecord } from '../../contracts/stock';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { SelectField, TextField } from '../../components/Field';
import { applyServerErrors, throughContract } from '../../lib/forms';
import { todayIso } from '../../lib/format';
import { formatNumber } from '../../lib/units';
import { useReceiveSpool } from './api';

type Values = {
  conductor: 'copper' | 'aluminium';
  standard: 'AWG' | 'metric';
  gauge: string;
  diameterMm: string;
  insulationGrade: '1' | '2' | '3';
  supplier: string;
  lot: string;
  netMass: string;
  location: string;
  receivedAt: string;
};

const num = (s: string) => (s.trim() === '' ? Number.NaN : Number(s.trim().replace(',', '.')));

function toRequest(v: Values) {
  return {
    conductor: v.conductor,
    wire: v.standard === 'AWG' ? { standard: 'AWG', gauge: num(v.gauge) } : { standard: 'metric', diameter: num(v.diameterMm) / 1000 },
    insulationGrade: Number(v.insulationGrade),
    supplier: v.supplier,
    lot: v.lot,
    netMass: num(v.netMass),
    location: v.location,
    receivedAt: v.receivedAt || undefined,
  };
}

const schema = throughContract(toRequest, receiveSpoolRequest, (i) => (i.code === 'invalid_type' && i.path[0] === 'netMass' ? 'Enter the net mass in kilograms' : undefined));

/** Request paths → the form's fields. */
const FIELD_OF: Record<string, keyof Values> = {
  conductor: 'conductor',
  'wire.gauge': 'gauge',
  'wire.diameter': 'diameterMm',
  wire: 'gauge',
  insulationGrade: 'insulationGrade',
  supplier: 'supplier',
  lot: 'lot',
  netMass: 'netMass',
  location: 'location',
  receivedAt: 'receivedAt',
};

const GAUGES = Array.from({ length: AWG_GAUGE_MAX - AWG_GAUGE_MIN + 1 }, (_, i) => AWG_GAUGE_MIN + i);

export function ReceiveSpoolForm({ onDone, onCancel }: { onDone: (s: SpoolRecord) => void; onCancel: () => void }) {
  const receive = useReceiveSpool();
  const [problems, setProblems] = useState<string[]>([]);
  const { register, handleSubmit, watch, setError, formState } = useForm<Values, unknown, ReturnType<typeof schema.parse>>({
    resolver: zodResolver(schema),
    defaultValues: { conductor: 'copper', standard: 'AWG', gauge: '28', diameterMm: '0.315', insulationGrade: '2', supplier: '', lot: '', netMass: '', location: '', receivedAt: todayIso() },
  });
  const standard = watch('standard');
  const errs = formState.errors as Record<string, { message?: string } | undefined> & Record<string, unknown>;
  // Issues arrive at request paths (wire.gauge); show them on the form's fields.
  const msg = (field: keyof Values): string | undefined => {
    for (const [path, f] of Object.entries(FIELD_OF)) {
      if (f !== field) continue;
      const parts = path.split('.');
      let e: unknown = errs;
      for (const p of parts) e = e && typeof e === 'object' ? (e as Record<string, unknown>)[p] : undefined;
      const m = (e as { message?: string } | undefined)?.message;
      if (m) return m;
    }
    return undefined;
  };

  const onSubmit = handleSubmit(async (body) => {
    setProblems([]);
    try {
      onDone(await receive.mutateAsync(body));
    } catch (err) {
      const left = applyServerErrors(err, (path, e) => {
        const field = FIELD_OF[String(path)];
        if (field) setError(field, e);
      }, Object.keys(FIELD_OF) as never[]);
      setProblems(left);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Receive a spool">
      {problems.length > 0 && <Alert kind="fault" title={problems[0]}>{problems.slice(1).join(' · ')}</Alert>}
      <div className="grid grid-cols-2 gap-3">
        <SelectField label="Conductor" error={msg('conductor')} {...register('conductor')}>
          <option value="copper">Copper</option>
          <option value="aluminium">Aluminium</option>
        </SelectField>
        <SelectField label="Insulation grade" error={msg('insulationGrade')} {...register('insulationGrade')}>
          <option value="1">Grade 1</option>
          <option value="2">Grade 2</option>
          <option value="3">Grade 3</option>
        </SelectField>
        <SelectField label="Size standard" {...register('standard')}>
          <option value="AWG">AWG gauge</option>
          <option value="metric">Metric (IEC nominal ⌀)</option>
        </SelectField>
        {standard === 'AWG' ? (
          <SelectField label="Wire size" error={msg('gauge')} {...register('gauge')}>
            {GAUGES.map((g) => (
              <option key={g} value={String(g)}>
                AWG {g}
              </option>
            ))}
          </SelectField>
        ) : (
          <SelectField label="Wire size" error={msg('diameterMm')} {...register('diameterMm')}>
            {METRIC_NOMINAL_DIAMETERS_MM.map((d) => (
              <option key={d} value={String(d)}>
                {formatNumber(d, d < 1 ? 3 : 2)} mm
              </option>
            ))}
          </SelectField>
        )}
        <TextField label="Supplier" autoComplete="off" error={msg('supplier')} {...register('supplier')} />
        <TextField label="Supplier’s lot" autoComplete="off" error={msg('lot')} {...register('lot')} />
        <TextField label="Net mass, kg" inputMode="decimal" autoComplete="off" hint={`Wire only, spool body not counted; up to ${SPOOL_MASS_MAX_KG} kg.`} error={msg('netMass')} {...register('netMass')} />
        <TextField label="Location" autoComplete="off" hint="Shelf or rack" error={msg('location')} {...register('location')} />
        <TextField label="Received" type="date" error={msg('receivedAt')} {...register('receivedAt')} />
      </div>
      <div className="mt-2 flex justify-end gap-2">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" busy={receive.isPending}>
          Receive spool
        </Button>
      </div>
    </form>
  );
}
