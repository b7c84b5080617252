import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { FormProvider, get, useFieldArray, useForm, useFormContext, useWatch, type FieldPath } from 'react-hook-form';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router';
import { AWG_GAUGE_MAX, AWG_GAUGE_MIN, METRIC_NOMINAL_DIAMETERS_MM, THERMAL_CLASS_VALUES } from '../../contracts/coil';
import { DEFAULT_TOLERANCE_PERCENT, type OrderDetail, type Requirement } from '../../contracts/orders';
import { Alert, FormProblems } from '../../components/Alert';
import { Button } from '../../components/Button';
import { SelectField, TextField } from '../../components/Field';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { applyServerErrors, formPaths } from '../../lib/forms';
import { queryClient } from '../../lib/queryClient';
import { useUnits } from '../../lib/session';
import { formatNumber, toMetres } from '../../lib/units';
import { customersQuery } from '../customers';
import { orderQuery, uploadAttachment, useCreateOrder, useUpdateOrder } from './api';
import { DropZone, newItem, precheck, UploadList, type UploadItem } from './Drawings';
import { emptyLine, emptyOrder, needsCircuit, orderFormSchema, orderToForm, type OrderFormValues, type Units } from './formModel';

type P = FieldPath<OrderFormValues>;

/** A text input registered under `name`, its message (client or server) right under it. */
function Input({ name, label, hint, className, ...rest }: { name: P; label: ReactNode; hint?: ReactNode; className?: string } & Omit<React.InputHTMLAttributes<HTMLInputElement>, 'name'>) {
  const { register, formState } = useFormContext<OrderFormValues>();
  const error = (get(formState.errors, name) as { message?: string } | undefined)?.message;
  return <TextField label={label} hint={hint} error={error} autoComplete="off" wrapperClassName={className} data-field={name} {...rest} {...register(name)} />;
}

function Select({ name, label, hint, className, children }: { name: P; label: ReactNode; hint?: ReactNode; className?: string; children: ReactNode }) {
  const { register, formState } = useFormContext<OrderFormValues>();
  const error = (get(formState.errors, name) as { message?: string } | undefined)?.message;
  return (
    <SelectField label={label} hint={hint} error={error} wrapperClassName={className} data-field={name} {...register(name)}>
      {children}
    </SelectField>
  );
}

function TextArea({ name, label, rows = 2, hint }: { name: P; label: string; rows?: number; hint?: string }) {
  const { register, formState } = useFormContext<OrderFormValues>();
  const error = (get(formState.errors, name) as { message?: string } | undefined)?.message;
  const id = `ta-${name}`;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold text-graphite-800">
        {label}
      </label>
      <textarea
        id={id}
        rows={rows}
        aria-invalid={error ? true : undefined}
        className={`rounded-md border px-3 py-1.5 text-[0.95rem] focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200 ${error ? 'border-fault' : 'border-graphite-300'}`}
        {...register(name)}
      />
      {error ? (
        <p className="text-sm font-medium text-fault" role="alert">
          {error}
        </p>
      ) : hint ? (
        <p className="text-sm text-graphite-500">{hint}</p>
      ) : null}
    </div>
  );
}

/** A message that belongs to a group of fields (a whole magnetic circuit, a whole target). */
function GroupError({ name }: { name: P }) {
  const { formState } = useFormContext<OrderFormValues>();
  const message = (get(formState.errors, name) as { message?: string } | undefined)?.message;
  if (!message) return null;
  return (
    <p className="col-span-full flex items-start gap-1 text-sm font-medium text-fault" role="alert">
      <span aria-hidden className="mt-[0.3rem] inline-block size-2 shrink-0 rotate-45 bg-fault" />
      {message}
    </p>
  );
}

function Group({ title, children, aside }: { title: string; children: ReactNode; aside?: ReactNode }) {
  return (
    <fieldset className="border-t border-graphite-200 pt-2">
      <legend className="flex w-full items-center justify-between pr-1 text-xs font-bold tracking-wider text-graphite-500 uppercase">
        <span className="bg-white pr-2">{title}</span>
        {aside}
      </legend>
      <div className="mt-1 grid grid-cols-2 gap-x-3 gap-y-2 sm:grid-cols-3 lg:grid-cols-6">{children}</div>
    </fieldset>
  );
}

function LineEditor({ index, count, onRemove, onDuplicate }: { index: number; count: number; onRemove: () => void; onDuplicate: () => void }) {
  const u = useUnits();
  const { control, register } = useFormContext<OrderFormValues>();
  const base = `lines.${index}` as const;
  const req = `${base}.requirement` as const;
  const [driveKind, target, hasCircuit, wireStd] = useWatch({
    control,
    name: [`${req}.drive.kind`, `${req}.target`, `${req}.hasCircuit`, `${req}.conductor.wire.standard`],
  });
  const circuitShown = hasCircuit || needsCircuit(target);
  const L = u.lengthSymbol;
  const inches = u.prefs.lengthUnit === 'in';

  return (
    <li className="rounded-lg border border-graphite-300 bg-white shadow-[inset_3px_0_0_#cf7d47]" data-line={index}>
      <div className="flex items-center justify-between gap-2 border-b border-graphite-200 px-4 py-1.5">
        <h3 className="font-semibold text-graphite-900">Line {index + 1}</h3>
        <div className="flex gap-1">
          <Button size="sm" variant="quiet" onClick={onDuplicate}>
            Duplicate
          </Button>
          <Button size="sm" variant="quiet" onClick={onRemove} disabled={count === 1} title={count === 1 ? 'An order needs at least one line' : undefined}>
            Remove line
          </Button>
        </div>
      </div>
      <div className="flex flex-col gap-3 px-4 pt-2 pb-4">
        <div className="grid grid-cols-2 gap-x-3 gap-y-2 sm:grid-cols-6 lg:grid-cols-12">
          <Input name={`${base}.quantity`} label="Quantity (pcs)" inputMode="numeric" className="lg:col-span-2" />
          <Input name={`${base}.title`} label="Title" hint="As the customer would recognise it" className="col-span-2 sm:col-span-4 lg:col-span-5" />
          <Input name={`${base}.customerPartNumber`} label="Customer part no." className="col-span-1 sm:col-span-3 lg:col-span-3" />
          <Input name={`${base}.tolerancePercent`} label="Resistance tol. (± %)" inputMode="decimal" hint={`Usually ±${DEFAULT_TOLERANCE_PERCENT} %`} className="sm:col-span-3 lg:col-span-2" />
        </div>

        <Group title="Supply and duty">
          <Select name={`${req}.drive.kind`} label="Supply">
            <option value="voltage">Voltage (V DC)</option>
            <option value="current">Current (A DC)</option>
          </Select>
          {driveKind === 'current' ? (
            <Input key="amps" name={`${req}.drive.amps`} label="Current (A)" inputMode="decimal" />
          ) : (
            <Input key="volts" name={`${req}.drive.volts`} label="Voltage (V)" inputMode="decimal" />
          )}
          <Input name={`${req}.dutyCycle`} label="Duty cycle (%)" inputMode="decimal" hint="100 % = continuous" />
          <Input name={`${req}.ambient`} label={`Ambient (${u.temperatureSymbol})`} inputMode="decimal" />
          <Select name={`${req}.insulationClass`} label="Thermal class" hint="IEC 60085">
            {THERMAL_CLASS_VALUES.map((c) => (
              <option key={c} value={String(c)}>
                {c} ({u.temperature(c, 0)})
              </option>
            ))}
          </Select>
          <Input name={`${req}.resistance`} label={`Resistance at ${u.temperature(20, 0)} (Ω)`} inputMode="decimal" hint="Only if the customer names one" />
        </Group>

        <Group title="Winding space">
          <Select name={`${req}.fit`} label="The dimensions are" className="col-span-2 lg:col-span-2">
            <option value="bobbin">the bobbin to wind on</option>
            <option value="envelope">an envelope to fit inside</option>
          </Select>
          <Input name={`${req}.bobbin.innerDiameter`} label={`Inner diameter (${L})`} inputMode="decimal" />
          <Input name={`${req}.bobbin.outerDiameter`} label={`Outer diameter (${L})`} inputMode="decimal" />
          <Input name={`${req}.bobbin.length`} label={`Traverse length (${L})`} inputMode="decimal" />
        </Group>

        <Group title="Target">
          <Select name={`${req}.target.kind`} label="The coil must give" className="col-span-2 lg:col-span-2">
            <option value="ampereTurns">Ampere-turns</option>
            <option value="pull">A pull at the air gap</option>
            <option value="field">A flux density</option>
          </Select>
          {target.kind === 'ampereTurns' && <Input key="at" name={`${req}.target.ampereTurns`} label="Ampere-turns (A)" inputMode="decimal" />}
          {target.kind === 'pull' && <Input key="pull" name={`${req}.target.force`} label="Pull (N)" inputMode="decimal" hint="Never a lifting rating" />}
          {target.kind === 'field' && (
            <>
              <Input key="b" name={`${req}.target.fluxDensity`} label="Flux density (T)" inputMode="decimal" />
              <Select name={`${req}.target.at`} label="Where">
                <option value="centre">At the winding’s centre (air core)</option>
                <option value="gap">In the air gap</option>
              </Select>
            </>
          )}
          <GroupError name={`${req}.target`} />
        </Group>

        <Group
          title="Magnetic circuit"
          aside={
            needsCircuit(target) ? (
              <span className="bg-white pl-2 text-xs font-semibold tracking-normal text-graphite-600 normal-case">Needed for this target</span>
            ) : (
              <label className="flex items-center gap-1.5 bg-white pl-2 text-sm font-semibold tracking-normal text-graphite-700 normal-case">
                <input type="checkbox" className="size-4 accent-copper-600" {...register(`${req}.hasCircuit`)} />
                The coil works in iron
              </label>
            )
          }
        >
          {circuitShown ? (
            <>
              <Input name={`${req}.magneticCircuit.relativePermeability`} label="Relative permeability µr" inputMode="decimal" />
              <Input name={`${req}.magneticCircuit.saturationFluxDensity`} label="Saturation (T)" inputMode="decimal" />
              <Input name={`${req}.magneticCircuit.ironPathLength`} label={`Iron path length (${L})`} inputMode="decimal" />
              <Input name={`${req}.magneticCircuit.airGap`} label={`Air gap (${L})`} inputMode="decimal" hint="Each gap" />
              <Input name={`${req}.magneticCircuit.gapCount`} label="Number of gaps" inputMode="numeric" />
              <Input name={`${req}.magneticCircuit.area`} label={`Pole area (${u.areaSymbol})`} inputMode="decimal" />
            </>
          ) : (
            <p className="col-span-full text-sm text-graphite-500">Air core: no iron around the coil.</p>
          )}
          <GroupError name={`${req}.magneticCircuit`} />
        </Group>

        <Group title="Conductor the customer asks for (optional)">
          <Select name={`${req}.conductor.material`} label="Material">
            <option value="">Engineer’s choice</option>
            <option value="copper">Copper</option>
            <option value="aluminium">Aluminium</option>
          </Select>
          <Select name={`${req}.conductor.wire.standard`} label="Wire size">
            <option value="">Engineer’s choice</option>
            <option value="AWG">AWG gauge</option>
            <option value="metric">Metric diameter</option>
          </Select>
          {wireStd === 'AWG' && (
            <Input name={`${req}.conductor.wire.gauge`} label="AWG" inputMode="numeric" hint={`${AWG_GAUGE_MIN}–${AWG_GAUGE_MAX}`} />
          )}
          {wireStd === 'metric' && (
            <Select name={`${req}.conductor.wire.diameter`} label="Bare diameter" hint="IEC 60317-0-1 nominal">
              <option value="">Choose…</option>
              {METRIC_NOMINAL_DIAMETERS_MM.map((d) => (
                <option key={d} value={String(d)}>
                  {d} mm{inches ? ` (${formatNumber(toMetres(d, 'mm') / 0.0254, 4)} in)` : ''}
                </option>
              ))}
            </Select>
          )}
          <Select name={`${req}.conductor.insulationGrade`} label="Insulation grade">
            <option value="">Engineer’s choice</option>
            <option value="1">Grade 1</option>
            <option value="2">Grade 2</option>
            <option value="3">Grade 3</option>
          </Select>
          <GroupError name={`${req}.conductor`} />
        </Group>

        <div className="grid gap-3 md:grid-cols-2">
          <TextArea name={`${base}.terminationNotes`} label="Termination notes" />
          <TextArea name={`${base}.leadNotes`} label="Lead notes" />
        </div>
      </div>
    </li>
  );
}


/** Counts the messages in an errors tree (for the summary above the form). */
function countErrors(node: unknown): number {
  if (!node || typeof node !== 'object') return 0;
  const own = typeof (node as { message?: unknown }).message === 'string' ? 1 : 0;
  return own + Object.entries(node).reduce((n, [k, v]) => (k === 'ref' || k === 'message' || k === 'type' ? n : n + countErrors(v)), 0);
}

export type SavedState = { saved: string; uploadProblems?: string[] };

function OrderForm({ order }: { order?: OrderDetail }) {
  const u = useUnits();
  const units: Units = { lengthUnit: u.prefs.lengthUnit, temperatureUnit: u.prefs.temperatureUnit };
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const customers = useQuery(customersQuery);
  const create = useCreateOrder();
  const update = useUpdateOrder();
  const [problems, setProblems] = useState<string[]>([]);
  const [uploads, setUploads] = useState<UploadItem[]>([]);
  const [uploading, setUploading] = useState(false);
  const [rejected, setRejected] = useState<string[]>([]);

  const saved = useMemo(() => new Map<number, Requirement>((order?.lines ?? []).map((l) => [l.id, l.requirement])), [order]);
  // The schema converts with the units the form was opened in (a change of units reopens the form).
  const schema = useMemo(() => orderFormSchema(units, saved), [units.lengthUnit, units.temperatureUnit, saved]); // eslint-disable-line react-hooks/exhaustive-deps
  const form = useForm({
    resolver: zodResolver(schema),
    defaultValues: order ? orderToForm(order, units) : emptyOrder(params.get('customer') ?? ''),
    mode: 'onSubmit',
    reValidateMode: 'onChange',
  });
  const { control, handleSubmit, setError, getValues, formState } = form;
  const lines = useFieldArray({ control, name: 'lines' });
  // The server's message above the form is about what was sent; once the user edits, it is stale.
  useEffect(() => {
    const sub = form.watch(() => setProblems((p) => (p.length ? [] : p)));
    return () => sub.unsubscribe();
  }, [form]);
  const errorCount = countErrors(formState.errors);

  const addFiles = (files: File[]) => {
    const bad: string[] = [];
    const ok: UploadItem[] = [];
    for (const f of files) {
      const why = precheck(f);
      if (why) bad.push(why);
      else ok.push(newItem(f));
    }
    setRejected(bad);
    setUploads((list) => [...list, ...ok]);
  };
  const patch = (key: string, change: Partial<UploadItem>) => setUploads((list) => list.map((it) => (it.key === key ? { ...it, ...change } : it)));

  const onSubmit = handleSubmit(async (request) => {
    setProblems([]);
    let result: OrderDetail;
    try {
      if (order) {
        const { customerId: _customer, ...change } = request;
        result = await update.mutateAsync({ id: order.id, change });
      } else {
        result = await create.mutateAsync(request);
      }
    } catch (err) {
      setProblems(applyServerErrors(err, setError, formPaths(getValues()) as P[]));
      if (isApiError(err) && Object.keys(err.fields).length) {
        // Bring the first field the server named into view.
        requestAnimationFrame(() => document.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      }
      return;
    }
    // The order is saved; now its drawings, one after another, each with its progress.
    const failed: string[] = [];
    if (uploads.length) {
      setUploading(true);
      for (const it of uploads.filter((x) => x.state !== 'done')) {
        const lineId = it.line === null ? null : (result.lines[it.line]?.id ?? null);
        patch(it.key, { state: 'sending', progress: 0 });
        try {
          await uploadAttachment(result.id, it.file, lineId, (p) => patch(it.key, { progress: p }));
          patch(it.key, { state: 'done', progress: 1 });
        } catch (err) {
          const message = errorMessage(err);
          patch(it.key, { state: 'failed', message });
          failed.push(`${it.file.name}: ${message}`);
        }
      }
      setUploading(false);
      // The order as cached at saving has no files yet.
      await queryClient.invalidateQueries({ queryKey: orderQuery(result.id).queryKey });
    }
    const state: SavedState = {
      saved: order ? `Saved the changes to ${result.number}.` : `Order ${result.number} is entered for ${result.customer.name}.`,
      uploadProblems: failed,
    };
    navigate(`/orders/${result.id}`, { state });
  });

  const busy = create.isPending || update.isPending || uploading;
  const lineOptions = lines.fields.map((_, i) => ({ value: i, label: `Line ${i + 1}` }));

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label={order ? `Edit order ${order.number}` : 'New order'}>
        <FormProblems messages={problems} />
        {errorCount > 0 && problems.length === 0 && (
          <Alert kind="fault" title={`${errorCount === 1 ? 'One field needs' : `${errorCount} fields need`} attention — nothing is saved until the whole order is right.`} />
        )}
        <Panel title="Order">
          <div className="grid grid-cols-2 gap-x-3 gap-y-2 lg:grid-cols-12">
            <Select name="customerId" label="Customer" className="col-span-2 lg:col-span-4" hint={order ? 'The customer of an entered order stays as it is' : undefined}>
              <option value="">{customers.isPending ? 'Loading…' : 'Choose the customer…'}</option>
              {customers.data
                ?.slice()
                .sort((a, b) => a.name.localeCompare(b.name))
                .map((c) => (
                  <option key={c.id} value={String(c.id)} disabled={Boolean(order) && c.id !== order?.customer.id}>
                    {c.name}
                  </option>
                ))}
            </Select>
            <Input name="purchaseOrder" label="Customer’s purchase order" className="col-span-2 lg:col-span-3" />
            <Input name="orderDate" type="date" label="Order date" className="lg:col-span-2" />
            <Input name="dueDate" type="date" label="Requested ship date" className="lg:col-span-3" />
            <div className="col-span-2 lg:col-span-12">
              <TextArea name="notes" label="Internal notes" hint="For the shop only; never shown to the customer." />
            </div>
          </div>
          {customers.isError && <p className="mt-2 text-sm text-fault">Could not load the customers: {errorMessage(customers.error)}</p>}
        </Panel>

        <section aria-labelledby="lines-heading" className="flex flex-col gap-3">
          <div className="flex items-center justify-between">
            <h2 id="lines-heading" className="text-lg font-semibold text-graphite-900">
              Lines ({lines.fields.length})
            </h2>
            <p className="text-sm text-graphite-600">
              Lengths in {u.lengthSymbol}, temperatures in {u.temperatureSymbol} — your units; the shop stores SI.
            </p>
          </div>
          <GroupError name="lines" />
          <ol className="flex flex-col gap-4">
            {lines.fields.map((f, i) => (
              <LineEditor
                key={f.id}
                index={i}
                count={lines.fields.length}
                onRemove={() => {
                  lines.remove(i);
                  setUploads((list) => list.map((it) => (it.line === i ? { ...it, line: null } : it.line !== null && it.line > i ? { ...it, line: it.line - 1 } : it)));
                }}
                onDuplicate={() => {
                  const copy = structuredClone(getValues(`lines.${i}`));
                  delete copy.id;
                  lines.insert(i + 1, { ...copy, customerPartNumber: '' });
                }}
              />
            ))}
          </ol>
          <div>
            <Button onClick={() => lines.append(emptyLine())}>Add line</Button>
          </div>
        </section>

        <Panel title="Drawings and specifications">
          <DropZone onFiles={addFiles} disabled={busy} />
          {rejected.map((r) => (
            <p key={r} className="mt-2 text-sm font-medium text-fault" role="alert">
              {r}
            </p>
          ))}
          <UploadList
            items={uploads}
            lineOptions={lineOptions}
            onLine={(key, line) => patch(key, { line })}
            onRemove={(key) => setUploads((list) => list.filter((it) => it.key !== key))}
          />
          {uploads.length > 0 && <p className="mt-2 text-sm text-graphite-600">The files go up after the order is saved.</p>}
        </Panel>

        <div className="sticky bottom-2 flex items-center justify-end gap-2 rounded-lg border border-graphite-300 bg-white/95 px-4 py-2.5 shadow-[0_4px_16px_rgb(20_22_24/0.12)] backdrop-blur">
          <span className="mr-auto text-sm text-graphite-600">
            {lines.fields.length === 1 ? '1 line' : `${lines.fields.length} lines`}
            {uploads.length > 0 && `, ${uploads.length === 1 ? '1 file' : `${uploads.length} files`} to upload`}
          </span>
          {uploading && <span className="text-sm text-graphite-600">Uploading drawings…</span>}
          <Link
            to={order ? `/orders/${order.id}` : '/orders'}
            className="inline-flex h-10 items-center rounded-md border border-graphite-300 bg-white px-4 font-semibold text-graphite-900 hover:bg-graphite-100"
          >
            Cancel
          </Link>
          <Button type="submit" variant="primary" busy={busy}>
            {order ? 'Save changes' : 'Save order'}
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}

export function NewOrderPage() {
  const u = useUnits();
  return (
    <div>
      <PageHeader title="New order" lead="One order with all its lines. Each line states what the coil must do; engineering turns it into a build sheet." />
      <OrderForm key={`${u.prefs.lengthUnit}-${u.prefs.temperatureUnit}`} />
    </div>
  );
}

export function EditOrderPage() {
  const id = Number(useParams().id);
  const u = useUnits();
  const order = useQuery({ ...orderQuery(id), enabled: Number.isInteger(id) && id > 0 });
  if (order.isPending) return <Loading what="Loading the order" />;
  if (order.isError) return <Alert kind="fault" title="Could not load the order">{errorMessage(order.error)}</Alert>;
  const o = order.data;
  if (!o.can.editLines) {
    return (
      <Alert kind="caution" title={`Order ${o.number} can no longer be edited here`}>
        Only an entered order is changed line by line; this one is {o.status.replace('_', ' ')}. <Link to={`/orders/${o.id}`} className="underline">Back to the order</Link>
      </Alert>
    );
  }
  return (
    <div>
      <PageHeader title={`Edit order ${o.number}`} lead={`${o.customer.name} — purchase order ${o.purchaseOrder}. Changes are recorded in the order’s history.`} />
      <OrderForm key={`${o.updatedAt}-${u.prefs.lengthUnit}-${u.prefs.temperatureUnit}`} order={o} />
    </div>
  );
}
