/**
 * The test bench (/test-bench?wo=ID), tablet-first: pick a work order (scan or type its number,
 * or tap one waiting in testing), generate serials, and record one unit at a time — DC resistance
 * with the winding temperature, hi-pot, insulation resistance, and the optional checks. Inputs are
 * in the user's units (temperatures °C or °F); the request goes out in SI. The server judges every
 * reading; this screen shows its verdict, reading by reading. A failed unit is retested here as a
 * new record (nothing is overwritten).
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState, type FormEvent, type ReactNode } from 'react';
import { useForm, useWatch, type Path } from 'react-hook-form';
import { Link, useSearchParams } from 'react-router';
import { STAGE_LABELS } from '../../contracts/stages';
import { recordTestRequest, TEST_DEFAULTS, TEMPERATURE_MAX, TEMPERATURE_MIN, type InstrumentRecord, type RecordTestRequest, type TestRecord } from '../../contracts/test-records';
import { Alert } from '../../components/Alert';
import { Button, buttonClass } from '../../components/Button';
import { TextField } from '../../components/Field';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { formatDay } from '../../lib/format';
import { applyServerErrors, throughContract } from '../../lib/forms';
import { useUnits } from '../../lib/session';
import { formatNumber, fromCelsius, toCelsius, type UnitFormatters } from '../../lib/units';
import { benchWorkOrderQuery, benchWorkOrdersQuery, findWorkOrderByNumber, instrumentsQuery, useGenerateSerials, useRecordTest, workOrderTestsQuery } from './api';
import { ohms, signedOhms, signedPercent } from './format';
import { StatusShape } from '../../components/Status';
import { HipotWarning, HotSurfaceWarning, UnitState, VerdictTable } from './parts';

export function TestBenchPage() {
  const [params, setParams] = useSearchParams();
  const raw = Number(params.get('wo'));
  const woId = Number.isInteger(raw) && raw > 0 ? raw : null;
  return (
    <div className="flex flex-col gap-5" data-testid="test-bench">
      <PageHeader title="Test bench" lead="Record each unit's readings. The server judges them against the build sheet and says why a unit fails." />
      <Picker current={woId} onPick={(id) => setParams(id ? { wo: String(id) } : {})} />
      {woId !== null && <Bench key={woId} woId={woId} />}
    </div>
  );
}

// ── Choosing the work order ────────────────────────────────────────────────────────────────

function Picker({ current, onPick }: { current: number | null; onPick: (id: number | null) => void }) {
  const list = useQuery(benchWorkOrdersQuery());
  const [text, setText] = useState('');
  // Once a work order is open the list folds away (the bench needs the room); it opens again on request.
  const [showList, setShowList] = useState(current === null);
  const [looking, setLooking] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const open = async (e: FormEvent) => {
    e.preventDefault();
    const typed = text.trim().toUpperCase().replace(/\s+/g, '');
    if (!typed) return;
    setProblem(null);
    setLooking(true);
    try {
      const url = /\/work-orders\/(\d+)/.exec(typed.toLowerCase());
      const inList = list.data?.find((w) => w.number.toUpperCase() === typed || w.number.toUpperCase().endsWith(`-${typed}`));
      const id = url ? Number(url[1]) : (inList?.id ?? (await findWorkOrderByNumber(typed))?.id);
      if (id) {
        onPick(id);
        setShowList(false);
        setText('');
      } else setProblem(`No work order ${typed}. Check the traveler and scan again.`);
    } catch (err) {
      setProblem(errorMessage(err));
    } finally {
      setLooking(false);
    }
  };
  return (
    <Panel title="Work order">
      <div className="flex flex-col gap-3">
        <form className="flex flex-wrap items-end gap-3" onSubmit={open}>
          <TextField
            label="Scan or type the work order number"
            value={text}
            onChange={(e) => setText(e.target.value)}
            placeholder="WO-26-00042"
            autoComplete="off"
            wrapperClassName="min-w-64 flex-1"
            className="h-14 text-xl"
          />
          <Button type="submit" size="lg" variant="primary" className="h-14" busy={looking}>
            Open
          </Button>
        </form>
        {problem && <Alert>{problem}</Alert>}
        {!showList ? (
          <Button size="lg" variant="quiet" className="self-start" onClick={() => setShowList(true)}>
            Show the work orders waiting at the bench
          </Button>
        ) : (
          <p className="text-sm font-semibold text-graphite-600">Waiting at the bench (testing, rework, inspection)</p>
        )}
        {!showList ? null : list.isPending ? (
          <Loading what="Loading work orders" />
        ) : list.error ? (
          <Alert>{errorMessage(list.error)}</Alert>
        ) : list.data.length === 0 ? (
          <p className="text-graphite-600">No work order is in testing now.</p>
        ) : (
          <div className="flex flex-wrap gap-2" data-testid="bench-work-orders">
            {list.data.map((w) => (
              <button
                key={w.id}
                type="button"
                onClick={() => {
                  onPick(w.id);
                  setShowList(false);
                }}
                aria-pressed={current === w.id}
                data-wo={w.number}
                className={`flex min-h-14 flex-col items-start rounded-md border-2 px-3 py-1.5 text-left ${current === w.id ? 'border-copper-600 bg-copper-50' : 'border-graphite-300 bg-white hover:bg-graphite-50'}`}
              >
                <span className="text-lg font-bold tabular-nums">{w.number}</span>
                <span className="text-sm text-graphite-600">
                  {STAGE_LABELS[w.stage]} · ×{w.quantity} · {w.line.title}
                </span>
              </button>
            ))}
          </div>
        )}
      </div>
    </Panel>
  );
}

// ── The bench for one work order ───────────────────────────────────────────────────────────

function Bench({ woId }: { woId: number }) {
  const u = useUnits();
  const wo = useQuery(benchWorkOrderQuery(woId));
  const tests = useQuery(workOrderTestsQuery(woId));
  const instruments = useQuery(instrumentsQuery());
  const serials = useGenerateSerials();
  const [count, setCount] = useState('1');
  const [suggested, setSuggested] = useState<string[]>([]);
  const [last, setLast] = useState<TestRecord | null>(null);
  const [preset, setPreset] = useState<{ serial: string; retest: boolean; n: number; focus: boolean }>({ serial: '', retest: false, n: 0, focus: false });
  const verdictRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (last) verdictRef.current?.scrollIntoView({ block: 'start' });
  }, [last]);

  if (wo.isPending || tests.isPending) return <Loading what="Loading the work order" />;
  if (wo.error || tests.error) return <Alert title="Cannot load the work order">{errorMessage(wo.error ?? tests.error)}</Alert>;
  const w = wo.data;
  const t = tests.data;
  const tested = new Set(t.units.map((x) => x.serial));
  const untested = suggested.filter((s) => !tested.has(s));
  const failed = t.units.filter((x) => x.state === 'failed_open' || x.state === 'rework');

  const generate = () => {
    const n = Number(count);
    serials.mutate({ workOrderId: woId, count: Number.isInteger(n) && n > 0 ? n : 1 }, { onSuccess: (s) => setSuggested(s) });
  };
  const pick = (serial: string, retest: boolean) => setPreset((p) => ({ serial, retest, n: p.n + 1, focus: true }));
  const nextUntested = (done: string) => suggested.find((s) => s !== done && !tested.has(s)) ?? '';

  return (
    <div className="flex flex-col gap-5" data-testid="bench" data-wo={w.number}>
      <div className="flex flex-wrap items-center justify-between gap-3 rounded-lg border border-graphite-200 bg-white px-4 py-3">
        <div>
          <p className="text-2xl font-bold tabular-nums">{w.number}</p>
          <p className="text-graphite-700">
            {w.order.customer.name} · {w.line.title} · ×{w.quantity} · {STAGE_LABELS[w.stage]}
          </p>
        </div>
        {w.buildSheet && (
          <dl className="flex flex-wrap gap-x-6 gap-y-1 text-graphite-900">
            <div>
              <dt className="text-sm font-semibold text-graphite-600">Design R20</dt>
              <dd className="text-xl font-bold tabular-nums">
                {ohms(w.buildSheet.resistance20)} ±{formatNumber(w.buildSheet.tolerancePercent, 1)} %
              </dd>
            </div>
            <div>
              <dt className="text-sm font-semibold text-graphite-600">Turns</dt>
              <dd className="text-xl font-bold tabular-nums">{formatNumber(w.buildSheet.turns, 0)}</dd>
            </div>
            <div>
              <dt className="text-sm font-semibold text-graphite-600">Tested</dt>
              <dd className="text-xl font-bold tabular-nums">
                {t.units.length} of {t.goodQuantity}
              </dd>
            </div>
          </dl>
        )}
        <Link className={buttonClass('secondary', 'lg')} to={`/work-orders/${w.id}/tests`}>
          All tests of {w.number}
        </Link>
      </div>

      <HipotWarning />

      <div className="grid gap-5 lg:grid-cols-[minmax(0,7fr)_minmax(0,5fr)]">
        <div className="flex flex-col gap-5">
          {last && (
            <div ref={verdictRef} className="scroll-mt-4">
              <LastVerdict record={last} u={u} />
            </div>
          )}
          <Panel title="Serial numbers">
            <div className="flex flex-col gap-3">
              <div className="flex flex-wrap items-end gap-3">
                <TextField label="How many" type="number" inputMode="numeric" min={1} max={500} value={count} onChange={(e) => setCount(e.target.value)} wrapperClassName="w-28" className="h-12 text-lg" />
                <Button size="lg" onClick={generate} busy={serials.isPending}>
                  Generate serials
                </Button>
              </div>
              {serials.error && <Alert>{errorMessage(serials.error)}</Alert>}
              {untested.length > 0 && (
                <div className="flex flex-wrap gap-2" data-testid="suggested-serials">
                  {untested.map((s) => (
                    <Button key={s} size="lg" variant={preset.serial === s ? 'primary' : 'secondary'} onClick={() => pick(s, false)}>
                      {s}
                    </Button>
                  ))}
                </div>
              )}
              <p className="text-sm text-graphite-600">Serials continue after the highest this work order has used. Tap one to test it, or type the unit's own serial below.</p>
            </div>
          </Panel>
          <RecordForm
            key={preset.n}
            woId={woId}
            preset={preset}
            u={u}
            instruments={instruments.data ?? []}
            instrumentsError={instruments.error ? errorMessage(instruments.error) : null}
            onRecorded={(r) => {
              setLast(r);
              const next = nextUntested(r.serial);
              setPreset((p) => ({ serial: next, retest: false, n: p.n + 1, focus: false }));
            }}
          />
        </div>
        <div className="flex flex-col gap-5">
          <Panel title={`Units (${t.units.length})`}>
            {t.units.length === 0 ? (
              <p className="text-graphite-600">No unit tested yet.</p>
            ) : (
              <ul className="flex flex-col divide-y divide-graphite-100" data-testid="bench-units">
                {[...t.units].reverse().map((x) => (
                  <li key={x.serial} className="flex flex-wrap items-center justify-between gap-2 py-2" data-unit={x.serial} data-state={x.state}>
                    <span className="font-semibold tabular-nums">{x.serial}</span>
                    <UnitState state={x.state} />
                    {(x.state === 'failed_open' || x.state === 'rework') && (
                      <Button size="md" onClick={() => pick(x.serial, true)}>
                        Retest
                      </Button>
                    )}
                  </li>
                ))}
              </ul>
            )}
            {failed.length > 0 && <p className="mt-2 text-sm text-graphite-600">A failed unit is retested as a new record; the foreman dispositions the failure on the work order's test page.</p>}
          </Panel>
        </div>
      </div>
    </div>
  );
}

function LastVerdict({ record, u }: { record: TestRecord; u: UnitFormatters }) {
  return (
    <section
      className={`rounded-lg border-2 bg-white ${record.passed ? 'border-ok' : 'border-fault'}`}
      data-testid="bench-verdict"
      data-passed={record.passed}
      data-serial={record.serial}
      aria-live="polite"
    >
      <header className={`flex flex-wrap items-center justify-between gap-3 px-4 py-3 ${record.passed ? 'bg-ok-soft' : 'bg-fault-soft'}`}>
        <p className="text-xl font-bold tabular-nums">
          {record.serial}
          {!record.firstTest && <span className="ml-2 text-base font-semibold text-graphite-700">(retest)</span>}
        </p>
        <span className={`inline-flex items-center gap-2 text-2xl font-bold tracking-wide uppercase ${record.passed ? 'text-ok' : 'text-fault'}`}>
          <StatusShape kind={record.passed ? 'good' : 'fault'} className="size-7" />
          {record.passed ? 'Pass' : 'Fail'}
        </span>
      </header>
      <div className="flex flex-col gap-3 p-4">
        <dl className="grid grid-cols-3 gap-3">
          <div>
            <dt className="text-sm font-semibold text-graphite-600">R20</dt>
            <dd className="text-xl font-bold tabular-nums">{ohms(record.resistance20)}</dd>
          </div>
          <div>
            <dt className="text-sm font-semibold text-graphite-600">Deviation</dt>
            <dd className="text-xl font-bold tabular-nums" data-testid="verdict-deviation">
              {signedPercent(record.deviationPercent)}
            </dd>
          </div>
          <div>
            <dt className="text-sm font-semibold text-graphite-600">in ohms</dt>
            <dd className="text-xl font-bold tabular-nums">{signedOhms(record.deviationOhms)}</dd>
          </div>
        </dl>
        <p className="text-sm text-graphite-600">
          Design {ohms(record.nominalResistance20)} ±{formatNumber(record.tolerancePercent, 1)} % at 20 °C; read {ohms(record.resistance)} at {u.temperature(record.temperature)}, corrected to 20 °C by
          the resistance method (IEC 60034-1).
        </p>
        <VerdictTable record={record} u={u} />
      </div>
    </section>
  );
}

// ── The form ───────────────────────────────────────────────────────────────────────────────

type Values = {
  serial: string;
  retest: boolean;
  resistance: string;
  temperature: string;
  hipotOn: boolean;
  hipot: { voltage: string; seconds: string; leakage: string; breakdown: 'no' | 'yes' };
  irOn: boolean;
  insulationResistance: { voltage: string; resistance: string };
  inductanceOn: boolean;
  inductance: string;
  turnsOn: boolean;
  turns: string;
  pullOn: boolean;
  pull: string;
  heatRunOn: boolean;
  heatRun: { coldResistance: string; coldTemperature: string; hotResistance: string; ambient: string };
  instrumentIds: string[];
  note: string;
};

const FIELDS: Path<Values>[] = [
  'serial',
  'resistance',
  'temperature',
  'hipot.voltage',
  'hipot.seconds',
  'hipot.leakage',
  'hipot.breakdown',
  'insulationResistance.voltage',
  'insulationResistance.resistance',
  'inductance',
  'turns',
  'pull',
  'heatRun.coldResistance',
  'heatRun.coldTemperature',
  'heatRun.hotResistance',
  'heatRun.ambient',
  'instrumentIds',
  'note',
];

/** Text → number; blank → undefined (the contract says "a number" for anything else). */
const num = (s: string): number | undefined => (s.trim() === '' ? undefined : Number(s.trim().replace(',', '.')));
const scaled = (s: string, factor: number) => {
  const n = num(s);
  return n === undefined || !Number.isFinite(n) ? n : n * factor;
};

/** The form's values (user's units) → the request (SI, °C). */
function toRequest(v: Values, unit: UnitFormatters['prefs']['temperatureUnit']): unknown {
  const temp = (s: string) => {
    const n = num(s);
    return n === undefined || !Number.isFinite(n) ? n : toCelsius(n, unit);
  };
  return {
    serial: v.serial,
    ...(v.retest && { retest: true }),
    resistance: num(v.resistance),
    temperature: temp(v.temperature),
    ...(v.hipotOn && {
      hipot: { voltage: num(v.hipot.voltage), seconds: num(v.hipot.seconds), leakage: scaled(v.hipot.leakage, 1e-3), breakdown: v.hipot.breakdown === 'yes' },
    }),
    ...(v.irOn && { insulationResistance: { voltage: num(v.insulationResistance.voltage), resistance: scaled(v.insulationResistance.resistance, 1e6) } }),
    ...(v.inductanceOn && { inductance: scaled(v.inductance, 1e-3) }),
    ...(v.turnsOn && { turns: num(v.turns) }),
    ...(v.pullOn && { pull: num(v.pull) }),
    ...(v.heatRunOn && {
      heatRun: {
        coldResistance: num(v.heatRun.coldResistance),
        coldTemperature: temp(v.heatRun.coldTemperature),
        hotResistance: num(v.heatRun.hotResistance),
        ambient: temp(v.heatRun.ambient),
      },
    }),
    ...(v.instrumentIds.length > 0 && { instrumentIds: v.instrumentIds.map(Number) }),
    ...(v.note.trim() && { note: v.note }),
  };
}

const TEMPERATURE_FIELDS = ['temperature', 'heatRun.coldTemperature', 'heatRun.ambient'];

function RecordForm({
  woId,
  preset,
  u,
  instruments,
  instrumentsError,
  onRecorded,
}: {
  woId: number;
  preset: { serial: string; retest: boolean; focus: boolean };
  u: UnitFormatters;
  instruments: InstrumentRecord[];
  instrumentsError: string | null;
  onRecorded: (r: TestRecord) => void;
}) {
  const tu = u.prefs.temperatureUnit;
  const T = u.temperatureSymbol;
  const schema = useMemo(
    () =>
      throughContract<Values, typeof recordTestRequest>((v) => toRequest(v, tu), recordTestRequest, (issue) => {
        const path = issue.path.join('.');
        if (TEMPERATURE_FIELDS.includes(path) && issue.message.includes('between')) {
          return `Between ${formatNumber(fromCelsius(TEMPERATURE_MIN, tu), 0)} and ${formatNumber(fromCelsius(TEMPERATURE_MAX, tu), 0)} ${T}`;
        }
        if (path === 'hipot.leakage' && issue.message.includes('at most')) return 'Leakage current: at most 10,000 mA';
        return undefined;
      }),
    [tu, T],
  );
  const form = useForm<Values, unknown, RecordTestRequest>({
    resolver: zodResolver(schema),
    defaultValues: {
      serial: preset.serial,
      retest: preset.retest,
      resistance: '',
      temperature: '',
      hipotOn: true,
      hipot: { voltage: '', seconds: String(TEST_DEFAULTS.hipotSeconds), leakage: '', breakdown: 'no' },
      irOn: true,
      insulationResistance: { voltage: String(TEST_DEFAULTS.insulationTestVolts), resistance: '' },
      inductanceOn: false,
      inductance: '',
      turnsOn: false,
      turns: '',
      pullOn: false,
      pull: '',
      heatRunOn: false,
      heatRun: { coldResistance: '', coldTemperature: '', hotResistance: '', ambient: '' },
      instrumentIds: [],
      note: '',
    },
  });
  const { register, handleSubmit, formState, setError, control } = form;
  const e = formState.errors;
  const on = useWatch({ control, name: ['hipotOn', 'irOn', 'inductanceOn', 'turnsOn', 'pullOn', 'heatRunOn', 'retest'] });
  const [hipotOn, irOn, inductanceOn, turnsOn, pullOn, heatRunOn, retest] = on;
  const record = useRecordTest();
  const [problems, setProblems] = useState<string[]>([]);
  useEffect(() => {
    if (preset.focus) form.setFocus('resistance');
  }, [form, preset.focus]);

  const submit = handleSubmit((body) => {
    setProblems([]);
    record.mutate(
      { workOrderId: woId, body },
      {
        onSuccess: (r) => onRecorded(r),
        onError: (err) => setProblems(applyServerErrors(err, setError, FIELDS)),
      },
    );
  });
  const big = 'h-12 text-lg tabular-nums';
  const dec = { inputMode: 'decimal' as const, autoComplete: 'off' };

  return (
    <Panel title={retest ? `Retest ${preset.serial}` : 'Record a unit'}>
      <form className="flex flex-col gap-5" onSubmit={submit} noValidate data-testid="record-form">
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Serial number" autoComplete="off" error={e.serial?.message} {...register('serial')} className={big} />
          <Toggle label="This is a retest of a failed unit" {...register('retest')} />
        </div>

        <Section title="DC resistance">
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField label="Resistance as read, Ω" {...dec} error={e.resistance?.message} {...register('resistance')} className={big} />
            <TextField label={`Winding temperature, ${T}`} {...dec} error={e.temperature?.message} hint="The winding's own temperature when read (at rest: the room's)" {...register('temperature')} className={big} />
          </div>
        </Section>

        <Section title="Hi-pot" toggle={<Toggle label="Hi-pot tested" {...register('hipotOn')} />}>
          {hipotOn && (
            <div className="flex flex-col gap-3">
              <div className="grid gap-4 sm:grid-cols-2">
                <TextField
                  label="Applied voltage, V"
                  {...dec}
                  error={e.hipot?.voltage?.message}
                  hint={`Test voltage ${TEST_DEFAULTS.hipotBaseVolts} V + ${TEST_DEFAULTS.hipotRatedMultiplier} × rated voltage (common practice)`}
                  {...register('hipot.voltage')}
                  className={big}
                />
                <TextField label="Held for, s" {...dec} error={e.hipot?.seconds?.message} {...register('hipot.seconds')} className={big} />
                <TextField label="Leakage current, mA" {...dec} error={e.hipot?.leakage?.message} hint={`At most ${TEST_DEFAULTS.hipotLeakageMax * 1000} mA (shop default)`} {...register('hipot.leakage')} className={big} />
                <fieldset className="flex flex-col gap-1">
                  <legend className="text-sm font-semibold text-graphite-800">Breakdown (flashover, trip)</legend>
                  <div className="flex gap-2">
                    {(['no', 'yes'] as const).map((b) => (
                      <label key={b} className="flex h-12 flex-1 cursor-pointer items-center justify-center gap-2 rounded-md border-2 border-graphite-300 text-lg font-semibold has-checked:border-copper-600 has-checked:bg-copper-50">
                        <input type="radio" value={b} className="size-5" {...register('hipot.breakdown')} />
                        {b === 'no' ? 'No' : 'Yes'}
                      </label>
                    ))}
                  </div>
                </fieldset>
              </div>
            </div>
          )}
        </Section>

        <Section title="Insulation resistance" toggle={<Toggle label="Insulation resistance measured" {...register('irOn')} />}>
          {irOn && (
            <div className="grid gap-4 sm:grid-cols-2">
              <TextField label="Test voltage, V DC" {...dec} error={e.insulationResistance?.voltage?.message} hint={`At least ${TEST_DEFAULTS.insulationTestVolts} V DC`} {...register('insulationResistance.voltage')} className={big} />
              <TextField label="Insulation resistance, MΩ" {...dec} error={e.insulationResistance?.resistance?.message} hint={`At least ${TEST_DEFAULTS.insulationResistanceMin / 1e6} MΩ (common practice)`} {...register('insulationResistance.resistance')} className={big} />
            </div>
          )}
        </Section>

        <Section title="More checks (when the traveler asks for them)">
          <div className="flex flex-col gap-4">
            <div className="grid gap-4 sm:grid-cols-3">
              <Toggle label="Inductance" {...register('inductanceOn')} />
              <Toggle label="Turns check" {...register('turnsOn')} />
              <Toggle label="Pull on fixture" {...register('pullOn')} />
            </div>
            {(inductanceOn || turnsOn || pullOn) && (
              <div className="grid gap-4 sm:grid-cols-3">
                {inductanceOn && <TextField label="Inductance, mH" {...dec} error={e.inductance?.message} {...register('inductance')} className={big} />}
                {turnsOn && <TextField label="Turns counted" inputMode="numeric" autoComplete="off" error={e.turns?.message} {...register('turns')} className={big} />}
                {pullOn && <TextField label="Pull, N" {...dec} error={e.pull?.message} hint="A check of this unit, never a lifting rating" {...register('pull')} className={big} />}
              </div>
            )}
            <Toggle label="Heat run" {...register('heatRunOn')} />
            {heatRunOn && (
              <div className="flex flex-col gap-3">
                <HotSurfaceWarning />
                <div className="grid gap-4 sm:grid-cols-2">
                  <TextField label="Cold resistance, Ω" {...dec} error={e.heatRun?.coldResistance?.message} {...register('heatRun.coldResistance')} className={big} />
                  <TextField label={`Cold winding temperature, ${T}`} {...dec} error={e.heatRun?.coldTemperature?.message} {...register('heatRun.coldTemperature')} className={big} />
                  <TextField label="Hot resistance (at the end), Ω" {...dec} error={e.heatRun?.hotResistance?.message} {...register('heatRun.hotResistance')} className={big} />
                  <TextField label={`Ambient at the end, ${T}`} {...dec} error={e.heatRun?.ambient?.message} {...register('heatRun.ambient')} className={big} />
                </div>
                <p className="text-sm text-graphite-600">The rise is found by the resistance method (IEC 60034-1, IEEE Std 118) on the server.</p>
              </div>
            )}
          </div>
        </Section>

        <Section title="Instruments used">
          <Instruments instruments={instruments} error={e.instrumentIds?.message ?? instrumentsError ?? undefined} register={register('instrumentIds')} />
        </Section>

        <TextField label="Note (optional)" autoComplete="off" error={e.note?.message} {...register('note')} />

        {problems.length > 0 && <Alert title="Not recorded">{problems.join(' ')}</Alert>}
        <Button type="submit" variant="primary" size="lg" className="h-14 text-lg" busy={record.isPending}>
          {retest ? 'Record the retest' : 'Record this unit'}
        </Button>
      </form>
    </Panel>
  );
}

function Section({ title, toggle, children }: { title: string; toggle?: ReactNode; children: ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-3 rounded-md border border-graphite-200 p-3">
      <legend className="px-1 text-base font-bold text-graphite-900">{title}</legend>
      {toggle}
      {children}
    </fieldset>
  );
}

type RegisterProps = ReturnType<ReturnType<typeof useForm<Values>>['register']>;

/** A checkbox as a big touch target. */
function Toggle({ label, ...rest }: { label: string } & RegisterProps) {
  return (
    <label className="flex min-h-12 cursor-pointer items-center gap-3 rounded-md border border-graphite-300 bg-white px-3 text-base font-semibold has-checked:border-copper-600 has-checked:bg-copper-50">
      <input type="checkbox" className="size-6 accent-copper-600" {...rest} />
      {label}
    </label>
  );
}

/** Instruments with their calibration due dates; an overdue one cannot be chosen, and says why. */
function Instruments({ instruments, error, register }: { instruments: InstrumentRecord[]; error?: string; register: RegisterProps }) {
  const usable = instruments.filter((i) => i.active);
  return (
    <div className="flex flex-col gap-2">
      {usable.length === 0 && <p className="text-graphite-600">No instruments listed.</p>}
      <div className="grid gap-2 sm:grid-cols-2" data-testid="instruments">
        {usable.map((i) => (
          <label
            key={i.id}
            data-instrument={i.serial}
            data-overdue={i.overdue}
            className={`flex min-h-14 items-center gap-3 rounded-md border px-3 py-1.5 ${i.overdue ? 'cursor-not-allowed border-graphite-200 bg-graphite-100 text-graphite-500' : 'cursor-pointer border-graphite-300 bg-white has-checked:border-copper-600 has-checked:bg-copper-50'}`}
          >
            <input type="checkbox" value={String(i.id)} disabled={i.overdue} className="size-6 shrink-0 accent-copper-600" {...register} />
            <span className="flex flex-col">
              <span className="font-semibold">
                {i.name} <span className="font-normal text-graphite-600">({i.serial})</span>
              </span>
              <span className={`text-sm ${i.overdue ? 'font-semibold text-fault' : 'text-graphite-600'}`}>
                {i.overdue ? `Calibration overdue since ${formatDay(i.calibrationDue)}: not usable until recalibrated` : `Calibration due ${formatDay(i.calibrationDue)}`}
              </span>
            </span>
          </label>
        ))}
      </div>
      {error && (
        <p className="text-sm font-medium text-fault" role="alert">
          {error}
        </p>
      )}
      <p className="text-sm text-graphite-600">Readings name the instruments used (traceability, ISO 9001). The server refuses an instrument past its calibration date.</p>
    </div>
  );
}
