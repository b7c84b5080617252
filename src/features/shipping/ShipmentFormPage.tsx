/**
 * A new shipment for the work orders chosen on Ready to ship (`?wo=1,2,3`): what ships (whole
 * work orders or chosen serials), where to, by which carrier, in which packages (in the user's
 * units), on which date. The contract checks the form before it is sent; the server's refusals
 * (a work order not ready, another customer's work order) land beside the work order they name.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { FormProvider, get, useFieldArray, useForm, useFormContext, useWatch, type FieldPath } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { SHIP_DATE_MAX_DAYS_AHEAD, type CreateShipmentRequest, type ReadyToShip, type ReadyWorkOrder } from '../../contracts/shipments';
import { Alert, FormProblems } from '../../components/Alert';
import { Button } from '../../components/Button';
import { TextField } from '../../components/Field';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { ApiError, errorMessage, isApiError } from '../../lib/api';
import { addDaysIso, formatDay, pieces, plural, todayIso } from '../../lib/format';
import { applyServerErrors, formPaths, parseNumber } from '../../lib/forms';
import { useUnits } from '../../lib/session';
import { toKilograms, massUnitFor } from '../../lib/units';
import { readyQuery, useCreateShipment } from './api';
import { Serials } from '../../components/Serials';
import { emptyPackage, emptyShipment, ticked, serverFieldsToForm, shipmentFormSchema, type ShipmentFormValues } from './formModel';

type P = FieldPath<ShipmentFormValues>;

type ReadyCustomer = ReadyToShip['customers'][number];
type Found = { wo: ReadyWorkOrder; customer: Pick<ReadyCustomer, 'id' | 'name' | 'shipTo'>; order: ReadyCustomer['orders'][number] };

const fieldError = (errors: unknown, name: string) => (get(errors, name) as { message?: string } | undefined)?.message;

function Input({ name, label, hint, className, ...rest }: { name: P; label: ReactNode; hint?: ReactNode; className?: string } & Omit<React.InputHTMLAttributes<HTMLInputElement>, 'name'>) {
  const { register, formState } = useFormContext<ShipmentFormValues>();
  return (
    <TextField label={label} hint={hint} error={fieldError(formState.errors, name)} autoComplete="off" wrapperClassName={className} data-field={name} {...rest} {...register(name)} />
  );
}

/** A message about a group of fields (a whole list, a work order). */
function GroupError({ name }: { name: string }) {
  const { formState } = useFormContext<ShipmentFormValues>();
  const message = fieldError(formState.errors, name);
  if (!message) return null;
  return (
    <p className="flex items-start gap-1 text-sm font-medium text-fault" role="alert" data-error-for={name}>
      <span aria-hidden className="mt-[0.3rem] inline-block size-2 shrink-0 rotate-45 bg-fault" />
      {message}
    </p>
  );
}

function ItemEditor({ index, found }: { index: number; found: Found | undefined }) {
  const { register, control } = useFormContext<ShipmentFormValues>();
  const ship = useWatch({ control, name: `items.${index}.ship` });
  const chosen = ticked(useWatch({ control, name: `items.${index}.serials` }));
  if (!found) return null;
  const { wo, order } = found;
  return (
    <li className="rounded-md border border-graphite-200 px-3 py-2.5" data-item={wo.number}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="font-semibold text-graphite-900">
          {wo.number}
          <span className="ml-2 font-normal text-graphite-700">
            order {order.number} · PO {order.purchaseOrder} · line {wo.lineNo}. {wo.lineTitle}
            {wo.customerPartNumber && ` (part ${wo.customerPartNumber})`}
          </span>
        </p>
        {wo.ready ? <StatusBadge kind="good">Ready</StatusBadge> : <StatusBadge kind="caution">Not ready: {wo.reasons.join('; ')}</StatusBadge>}
      </div>
      <GroupError name={`items.${index}.workOrderId`} />
      <fieldset className="mt-2 flex flex-wrap gap-2">
        <legend className="sr-only">How much of {wo.number} ships</legend>
        <label className="flex cursor-pointer items-center gap-2 rounded-md border border-graphite-300 px-3 py-1.5 text-sm font-semibold has-[:checked]:border-copper-600 has-[:checked]:bg-copper-50">
          <input type="radio" value="all" className="size-4 accent-copper-600" {...register(`items.${index}.ship`)} />
          All {pieces(wo.quantity)} still to ship
        </label>
        <label className="flex cursor-pointer items-center gap-2 rounded-md border border-graphite-300 px-3 py-1.5 text-sm font-semibold has-[:checked]:border-copper-600 has-[:checked]:bg-copper-50">
          <input type="radio" value="some" className="size-4 accent-copper-600" {...register(`items.${index}.ship`)} disabled={wo.serials.length === 0} />
          Only the units I tick
        </label>
      </fieldset>
      {ship === 'some' ? (
        <fieldset className="mt-2">
          <legend className="text-sm font-semibold text-graphite-800">
            Serials to ship ({chosen.length} of {wo.serials.length})
          </legend>
          <div className="mt-1 grid grid-cols-[repeat(auto-fill,minmax(9rem,1fr))] gap-1">
            {wo.serials.map((s) => (
              <label key={s} className="tabular flex cursor-pointer items-center gap-2 rounded border border-graphite-200 px-2 py-1 text-sm has-[:checked]:border-copper-500 has-[:checked]:bg-copper-50">
                <input type="checkbox" value={s} className="size-4 accent-copper-600" {...register(`items.${index}.serials`)} />
                {s}
              </label>
            ))}
          </div>
          <GroupError name={`items.${index}.serials`} />
        </fieldset>
      ) : (
        <p className="mt-1 text-sm text-graphite-600">
          Serials: <Serials serials={wo.serials} show={8} />
        </p>
      )}
    </li>
  );
}

function PackagesEditor() {
  const u = useUnits();
  const { control } = useFormContext<ShipmentFormValues>();
  const packages = useFieldArray({ control, name: 'packages' });
  const values = useWatch({ control, name: 'packages' });
  const mass = massUnitFor(u.prefs.lengthUnit);
  const L = u.lengthSymbol;
  const total = (values ?? []).reduce((kg, p) => {
    const n = parseNumber(p.weight);
    return n === undefined || Number.isNaN(n) ? kg : kg + toKilograms(n, mass);
  }, 0);
  return (
    <Panel
      title={`Packages (${packages.fields.length})`}
      actions={
        <Button size="sm" onClick={() => packages.append(emptyPackage())} disabled={packages.fields.length >= 200}>
          Add package
        </Button>
      }
    >
      <ol className="flex flex-col gap-2">
        {packages.fields.map((f, i) => (
          <li key={f.id} className="grid grid-cols-2 items-start gap-x-3 gap-y-2 sm:grid-cols-[3rem_repeat(4,minmax(0,1fr))_auto]" data-package={i + 1}>
            <span className="col-span-2 pt-1 font-semibold text-graphite-700 sm:col-span-1 sm:pt-8">#{i + 1}</span>
            <Input name={`packages.${i}.weight`} label={`Weight (${mass})`} inputMode="decimal" />
            <Input name={`packages.${i}.length`} label={`Length (${L})`} inputMode="decimal" />
            <Input name={`packages.${i}.width`} label={`Width (${L})`} inputMode="decimal" />
            <Input name={`packages.${i}.height`} label={`Height (${L})`} inputMode="decimal" />
            <Button variant="quiet" className="sm:mt-6" onClick={() => packages.remove(i)} disabled={packages.fields.length === 1} aria-label={`Remove package ${i + 1}`}>
              Remove
            </Button>
          </li>
        ))}
      </ol>
      <GroupError name="packages.root" />
      <p className="mt-3 text-graphite-700" data-testid="form-total-weight">
        Total weight: <span className="font-semibold text-graphite-950">{u.mass(total)}</span>
      </p>
    </Panel>
  );
}


/** Common ways a shipment leaves; any other carrier's name may be typed. */
const CARRIER_HINTS = ['Parcel courier', 'Freight forwarder', 'Own van', 'Customer pick-up'];

function ShipmentForm({ found, ids }: { found: Found[]; ids: number[] }) {
  const u = useUnits();
  const lengthUnit = u.prefs.lengthUnit;
  const navigate = useNavigate();
  const create = useCreateShipment();
  const [problems, setProblems] = useState<string[]>([]);
  const customer = found[0].customer;
  const schema = useMemo(() => shipmentFormSchema(lengthUnit), [lengthUnit]);
  const form = useForm<ShipmentFormValues, unknown, CreateShipmentRequest>({
    resolver: zodResolver(schema),
    defaultValues: emptyShipment(ids, customer.shipTo),
    mode: 'onSubmit',
    reValidateMode: 'onChange',
  });
  const { handleSubmit, setError, getValues, formState, register } = form;
  useEffect(() => {
    const sub = form.watch(() => setProblems((p) => (p.length ? [] : p)));
    return () => sub.unsubscribe();
  }, [form]);
  const byId = new Map(found.map((f) => [f.wo.id, f]));
  const customers = new Set(found.map((f) => f.customer.id));
  const today = todayIso();

  const onSubmit = handleSubmit(async (request) => {
    setProblems([]);
    try {
      const shipment = await create.mutateAsync(request);
      navigate(`/shipments/${shipment.id}`, { state: { created: `Shipment ${shipment.number} is recorded.` } });
    } catch (err) {
      const values = getValues();
      const mapped = isApiError(err) ? new ApiError(err.status, err.code, err.message, serverFieldsToForm(err.fields, values, new Map(found.map((f) => [f.wo.id, f.wo.number])), err.current), err.current) : err;
      setProblems(applyServerErrors(mapped, setError, [...formPaths(values), 'items.root', 'packages.root'] as P[]));
      requestAnimationFrame(() => document.querySelector<HTMLElement>('[aria-invalid="true"], [data-error-for]')?.scrollIntoView({ block: 'center' }));
    }
  });

  const errorCount = Object.keys(formState.errors).length;
  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="New shipment">
        <PageHeader title="New shipment" lead={`For ${customer.name}. Recording it moves the work orders on, updates the order and sends the customer their shipment notice.`} />
        <FormProblems messages={problems} />
        {errorCount > 0 && problems.length === 0 && <Alert kind="fault" title="Some fields need attention — nothing is recorded until the whole shipment is right." />}
        {customers.size > 1 && (
          <Alert kind="caution" title="These work orders belong to more than one customer">
            A shipment carries one customer’s work orders; the server will refuse this one. Go back and choose again.
          </Alert>
        )}

        <Panel title="What ships">
          <ul className="flex flex-col gap-2">
            {ids.map((id, i) => (
              <ItemEditor key={id} index={i} found={byId.get(id)} />
            ))}
          </ul>
          <GroupError name="items.root" />
        </Panel>

        <div className="grid gap-4 lg:grid-cols-2">
          <Panel title="Ship to">
            <div className="grid grid-cols-2 gap-x-3 gap-y-2">
              <Input name="shipTo.line1" label="Street and number" className="col-span-2" />
              <Input name="shipTo.line2" label="Second address line" className="col-span-2" />
              <Input name="shipTo.postalCode" label="Postal code" />
              <Input name="shipTo.city" label="Town or city" />
              <Input name="shipTo.region" label="Region or state" />
              <Input name="shipTo.country" label="Country" />
              <Input name="attention" label="Attention" hint="Who receives it; printed on the packing list" className="col-span-2" />
            </div>
          </Panel>
          <Panel title="Carrier">
            <div className="grid grid-cols-2 gap-x-3 gap-y-2">
              <Input name="carrier" label="Carrier" list="carrier-hints" className="col-span-2 sm:col-span-1" />
              <datalist id="carrier-hints">
                {CARRIER_HINTS.map((c) => (
                  <option key={c} value={c} />
                ))}
              </datalist>
              <Input name="service" label="Service" hint="For example next day, economy" className="col-span-2 sm:col-span-1" />
              <Input name="trackingNumber" label="Tracking number" hint="Leave empty for the own van or a pick-up" className="col-span-2" />
              <Input name="shipDate" type="date" label="Ship date" max={addDaysIso(today, SHIP_DATE_MAX_DAYS_AHEAD)} hint={`Today is ${formatDay(today)}`} className="col-span-2 sm:col-span-1" />
            </div>
          </Panel>
        </div>

        <PackagesEditor />

        <Panel title="Packing note">
          <label htmlFor="packing-note" className="text-sm font-semibold text-graphite-800">
            Note on the packing list <span className="font-normal text-graphite-500">(the customer reads it)</span>
          </label>
          <textarea
            id="packing-note"
            rows={2}
            className="mt-1 block w-full rounded-md border border-graphite-300 px-3 py-1.5 focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200"
            {...register('packingNote')}
          />
          <p className="mt-1 text-sm text-graphite-600">
            Lifting or holding magnets: the packing note and the documents never state a lifting rating; the customer’s use follows the applicable lifting-device
            standard.
          </p>
        </Panel>

        <div className="flex flex-wrap items-center justify-end gap-3">
          <Link to="/shipping" className="font-semibold text-graphite-700 underline-offset-2 hover:underline">
            Back to ready to ship
          </Link>
          <Button type="submit" variant="primary" size="lg" busy={create.isPending}>
            Record shipment
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}

export function ShipmentFormPage() {
  const [params] = useSearchParams();
  const ids = useMemo(
    () => [...new Set((params.get('wo') ?? '').split(',').map((s) => Number(s.trim())).filter((n) => Number.isInteger(n) && n > 0))],
    [params],
  );
  // Once the form is open it keeps its work orders; the list refreshes only when asked.
  const ready = useQuery({ ...readyQuery, staleTime: Infinity, refetchOnWindowFocus: false });

  const found = useMemo(() => {
    const out = new Map<number, Found>();
    for (const c of ready.data?.customers ?? [])
      for (const o of c.orders) for (const w of o.workOrders) if (ids.includes(w.id)) out.set(w.id, { wo: w, customer: { id: c.id, name: c.name, shipTo: c.shipTo }, order: o });
    return out;
  }, [ready.data, ids]);

  if (ids.length === 0)
    return (
      <Alert kind="idle" title="No work orders chosen">
        Choose the work orders to ship on{' '}
        <Link to="/shipping" className="underline">
          Ready to ship
        </Link>
        .
      </Alert>
    );
  if (ready.isPending) return <Loading what="Loading the work orders" />;
  if (ready.isError)
    return (
      <Alert kind="fault" title="Could not load the work orders in packing">
        {errorMessage(ready.error)}
      </Alert>
    );
  const missing = ids.filter((id) => !found.has(id));
  const present = ids.filter((id) => found.has(id));
  if (present.length === 0)
    return (
      <Alert kind="caution" title="These work orders are no longer waiting in packing">
        They may have shipped already.{' '}
        <Link to="/shipping" className="underline">
          Back to ready to ship
        </Link>
      </Alert>
    );
  return (
    <div className="flex flex-col gap-3">
      {missing.length > 0 && (
        <Alert kind="caution" title={`${plural(missing.length, 'work order')} chosen earlier ${missing.length === 1 ? 'is' : 'are'} no longer in packing and left out`} />
      )}
      <ShipmentForm found={present.map((id) => found.get(id)!)} ids={present} />
    </div>
  );
}
