import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useFieldArray, useForm, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router';
import { createCustomerRequest, EMPTY_ADDRESS, type Address, type CustomerDetail } from '../../contracts/customers';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { TextField } from '../../components/Field';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { applyServerErrors, formPaths, throughContract } from '../../lib/forms';
import { customerQuery, useCreateCustomer, useUpdateCustomer } from './api';

type ContactValues = { id?: number; name: string; email: string; phone: string; notifyOrders: boolean; notifyShipping: boolean };
type CustomerFormValues = {
  name: string;
  notes: string;
  billingAddress: Address;
  /** The request has `shippingAddress: null` for "ship to the billing address". */
  shipSeparately: boolean;
  shippingAddress: Address;
  contacts: ContactValues[];
};

const toRequest = (v: CustomerFormValues) => ({
  name: v.name,
  notes: v.notes,
  billingAddress: v.billingAddress,
  shippingAddress: v.shipSeparately ? v.shippingAddress : null,
  contacts: v.contacts.map((c) => (c.id ? c : { ...c, id: undefined })),
});

const customerForm = throughContract(toRequest, createCustomerRequest);

const NEW_CONTACT: ContactValues = { name: '', email: '', phone: '', notifyOrders: false, notifyShipping: false };

function valuesOf(c: CustomerDetail | undefined): CustomerFormValues {
  if (!c) return { name: '', notes: '', billingAddress: EMPTY_ADDRESS, shipSeparately: false, shippingAddress: EMPTY_ADDRESS, contacts: [{ ...NEW_CONTACT, notifyOrders: true, notifyShipping: true }] };
  return {
    name: c.name,
    notes: c.notes ?? '',
    billingAddress: { ...EMPTY_ADDRESS, ...c.billingAddress },
    shipSeparately: c.shippingAddress !== null,
    shippingAddress: { ...EMPTY_ADDRESS, ...(c.shippingAddress ?? {}) },
    contacts: c.contacts.map((p) => ({ id: p.id, name: p.name, email: p.email, phone: p.phone, notifyOrders: p.notifyOrders, notifyShipping: p.notifyShipping })),
  };
}

function AddressFields({ prefix, register, errors }: { prefix: 'billingAddress' | 'shippingAddress'; register: UseFormRegister<CustomerFormValues>; errors?: FieldErrors<Address> }) {
  return (
    <div className="grid gap-3 sm:grid-cols-6">
      <TextField wrapperClassName="sm:col-span-6" label="Street and number" autoComplete="off" error={errors?.line1?.message} {...register(`${prefix}.line1`)} />
      <TextField wrapperClassName="sm:col-span-6" label="Second line" autoComplete="off" error={errors?.line2?.message} {...register(`${prefix}.line2`)} />
      <TextField wrapperClassName="sm:col-span-2" label="Postal code" autoComplete="off" error={errors?.postalCode?.message} {...register(`${prefix}.postalCode`)} />
      <TextField wrapperClassName="sm:col-span-4" label="Town or city" autoComplete="off" error={errors?.city?.message} {...register(`${prefix}.city`)} />
      <TextField wrapperClassName="sm:col-span-3" label="Region or state" autoComplete="off" error={errors?.region?.message} {...register(`${prefix}.region`)} />
      <TextField wrapperClassName="sm:col-span-3" label="Country" autoComplete="off" error={errors?.country?.message} {...register(`${prefix}.country`)} />
    </div>
  );
}

function CustomerForm({ customer }: { customer?: CustomerDetail }) {
  const navigate = useNavigate();
  const create = useCreateCustomer();
  const update = useUpdateCustomer();
  const [problems, setProblems] = useState<string[]>([]);
  const { register, handleSubmit, control, watch, setError, getValues, formState } = useForm({
    resolver: zodResolver(customerForm),
    defaultValues: valuesOf(customer),
  });
  const contacts = useFieldArray({ control, name: 'contacts' });
  const e = formState.errors;
  const shipSeparately = watch('shipSeparately');

  const onSubmit = handleSubmit(async (request) => {
    setProblems([]);
    try {
      const saved = customer
        ? await update.mutateAsync({ id: customer.id, change: request })
        : await create.mutateAsync({ ...request, contacts: request.contacts.map(({ id: _id, ...c }) => c) });
      navigate(`/customers/${saved.id}`, { state: { saved: customer ? `Saved the changes to ${saved.name}.` : `Created ${saved.name}.` } });
    } catch (err) {
      setProblems(applyServerErrors(err, setError, formPaths(getValues()) as never[]));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label={customer ? `Edit ${customer.name}` : 'New customer'}>
      {problems.length > 0 && (
        <Alert kind="fault" title={problems[0]}>
          {problems.length > 1 && (
            <ul className="list-disc pl-4">
              {problems.slice(1).map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          )}
        </Alert>
      )}
      {Object.keys(e).length > 0 && problems.length === 0 && <Alert kind="fault" title="Some fields need attention; each says what is wrong." />}
      <Panel title="Company">
        <div className="grid gap-3 md:grid-cols-2">
          <TextField label="Company name" autoComplete="off" error={e.name?.message} {...register('name')} />
          <div className="flex flex-col gap-1 md:row-span-2">
            <label htmlFor="customer-notes" className="text-sm font-semibold text-graphite-800">
              Internal notes
            </label>
            <textarea
              id="customer-notes"
              rows={4}
              className={`rounded-md border px-3 py-2 text-[0.95rem] focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200 ${e.notes ? 'border-fault' : 'border-graphite-300'}`}
              aria-invalid={e.notes ? true : undefined}
              {...register('notes')}
            />
            <p className="text-sm text-graphite-500">{e.notes?.message ?? 'Never shown to the customer.'}</p>
          </div>
        </div>
      </Panel>

      <div className="grid gap-4 lg:grid-cols-2">
        <Panel title="Billing address">
          <AddressFields prefix="billingAddress" register={register} errors={e.billingAddress} />
        </Panel>
        <Panel title="Shipping address">
          <label className="mb-3 flex items-center gap-2 text-sm font-semibold text-graphite-800">
            <input type="checkbox" className="size-4 accent-copper-600" {...register('shipSeparately')} />
            Ship to a different address than the billing address
          </label>
          {shipSeparately ? (
            <AddressFields prefix="shippingAddress" register={register} errors={e.shippingAddress} />
          ) : (
            <p className="text-graphite-600">Shipments go to the billing address.</p>
          )}
        </Panel>
      </div>

      <Panel
        title={`Contacts (${contacts.fields.length})`}
        actions={
          <Button size="sm" onClick={() => contacts.append({ ...NEW_CONTACT })}>
            Add contact
          </Button>
        }
      >
        {e.contacts?.message && <p className="mb-2 text-sm font-medium text-fault">{e.contacts.message}</p>}
        {contacts.fields.length === 0 && <p className="text-graphite-500">No contacts. Acknowledgements and shipment notices need one with an e-mail address.</p>}
        <ol className="flex flex-col gap-3">
          {contacts.fields.map((f, i) => {
            const ce = e.contacts?.[i];
            return (
              <li key={f.id} className="rounded-md border border-graphite-200 p-3" data-contact={i}>
                <fieldset className="grid items-start gap-3 md:grid-cols-[1.2fr_1.4fr_1fr_auto_auto]">
                  <legend className="sr-only">Contact {i + 1}</legend>
                  <TextField label="Name" autoComplete="off" error={ce?.name?.message} {...register(`contacts.${i}.name`)} />
                  <TextField label="E-mail" type="email" autoComplete="off" error={ce?.email?.message} {...register(`contacts.${i}.email`)} />
                  <TextField label="Phone" type="tel" autoComplete="off" error={ce?.phone?.message} {...register(`contacts.${i}.phone`)} />
                  <div className="flex flex-col gap-1.5 pt-6 text-sm">
                    <label className="flex items-center gap-2">
                      <input type="checkbox" className="size-4 accent-copper-600" {...register(`contacts.${i}.notifyOrders`)} />
                      Order notices
                    </label>
                    <label className="flex items-center gap-2">
                      <input type="checkbox" className="size-4 accent-copper-600" {...register(`contacts.${i}.notifyShipping`)} />
                      Shipping notices
                    </label>
                  </div>
                  <Button size="sm" variant="quiet" className="mt-6" onClick={() => contacts.remove(i)} aria-label={`Remove contact ${i + 1}`}>
                    Remove
                  </Button>
                </fieldset>
              </li>
            );
          })}
        </ol>
      </Panel>

      <div className="flex justify-end gap-2">
        <Link to={customer ? `/customers/${customer.id}` : '/customers'} className="inline-flex h-10 items-center rounded-md border border-graphite-300 bg-white px-4 font-semibold text-graphite-900 hover:bg-graphite-100">
          Cancel
        </Link>
        <Button type="submit" variant="primary" busy={create.isPending || update.isPending}>
          {customer ? 'Save changes' : 'Create customer'}
        </Button>
      </div>
    </form>
  );
}

export function NewCustomerPage() {
  return (
    <div>
      <PageHeader title="New customer" lead="A company the shop builds for. Contacts who get order or shipping notices need an e-mail address." />
      <CustomerForm />
    </div>
  );
}

export function EditCustomerPage() {
  const id = Number(useParams().id);
  const customer = useQuery({ ...customerQuery(id), enabled: Number.isInteger(id) && id > 0 });
  if (customer.isPending) return <Loading what="Loading the customer" />;
  if (customer.isError) return <Alert kind="fault" title="Could not load the customer">{errorMessage(customer.error)}</Alert>;
  return (
    <div>
      <PageHeader title={`Edit ${customer.data.name}`} lead="Changes take effect at once. Removing a contact here removes them from future notices." />
      <CustomerForm key={customer.data.updatedAt} customer={customer.data} />
    </div>
  );
}
