import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useState, type FormEvent } from 'react';
import { useForm, type UseFormRegisterReturn } from 'react-hook-form';
import { z } from 'zod';
import { ROLE_LABELS, ROLES } from '../../contracts/roles';
import { createUserRequest, PASSWORD_MIN, updateUserRequest, type UserRecord } from '../../contracts/users';
import { Alert, FormProblems } from '../../components/Alert';
import { Button } from '../../components/Button';
import { SelectField, TextField } from '../../components/Field';
import { errorMessage, isApiError } from '../../lib/api';
import { applyServerErrors } from '../../lib/forms';
import { customerOptionsQuery, useCreateUser, useUpdateUser } from './api';

/** A <select> gives text; the contracts want a company id or null. */
const toCustomerId = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v));

function CompanySelect({ error, registration }: { error?: string; registration: UseFormRegisterReturn }) {
  const companies = useQuery(customerOptionsQuery);
  return (
    <SelectField label="Customer company" error={error ?? (companies.isError ? 'Could not load the companies' : undefined)} {...registration}>
      <option value="">{companies.isPending ? 'Loading…' : 'Choose the company…'}</option>
      {companies.data?.map((c) => (
        <option key={c.id} value={String(c.id)}>
          {c.name}
        </option>
      ))}
    </SelectField>
  );
}


function Actions({ onCancel, busy, submit }: { onCancel: () => void; busy: boolean; submit: string }) {
  return (
    <div className="mt-2 flex justify-end gap-2">
      <Button onClick={onCancel}>Cancel</Button>
      <Button type="submit" variant="primary" busy={busy}>
        {submit}
      </Button>
    </div>
  );
}

// ── create ──────────────────────────────────────────────────────────────────

type CreateIn = z.input<typeof createUserRequest>;
type CreateOut = z.output<typeof createUserRequest>;

export function CreateUserForm({ onDone, onCancel }: { onDone: (u: UserRecord) => void; onCancel: () => void }) {
  const create = useCreateUser();
  const [problems, setProblems] = useState<string[]>([]);
  const { register, handleSubmit, setError, watch, setValue, formState } = useForm<CreateIn, unknown, CreateOut>({
    resolver: zodResolver(createUserRequest),
    defaultValues: { email: '', name: '', role: 'office', password: '', customerId: null },
  });
  const role = watch('role');
  useEffect(() => {
    if (role !== 'customer') setValue('customerId', null);
  }, [role, setValue]);
  const e = formState.errors;

  const onSubmit = handleSubmit(async (values) => {
    setProblems([]);
    try {
      onDone(await create.mutateAsync(values));
    } catch (err) {
      setProblems(applyServerErrors(err, setError, ['email', 'name', 'role', 'password', 'customerId']));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      <FormProblems messages={problems} />
      <TextField label="Name" autoComplete="off" error={e.name?.message} {...register('name')} />
      <TextField label="E-mail" type="email" autoComplete="off" error={e.email?.message} {...register('email')} />
      <SelectField label="Role" error={e.role?.message} {...register('role')}>
        {ROLES.map((r) => (
          <option key={r} value={r}>
            {ROLE_LABELS[r]}
          </option>
        ))}
      </SelectField>
      {role === 'customer' && <CompanySelect error={e.customerId?.message} registration={register('customerId', { setValueAs: toCustomerId })} />}
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters. Give it to the person in private; they sign in with it.`}
        error={e.password?.message}
        {...register('password')}
      />
      {role !== 'customer' && e.customerId?.message && <Alert kind="fault">{e.customerId.message}</Alert>}
      <Actions onCancel={onCancel} busy={create.isPending} submit="Create user" />
    </form>
  );
}

// ── change role ─────────────────────────────────────────────────────────────

const roleChange = z.object({ role: z.enum(ROLES), customerId: z.number().int().positive().nullable() }).superRefine((v, ctx) => {
  // The same rule the server keeps (createUserRequest states it for new users).
  if (v.role === 'customer' && !v.customerId) ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'Choose the customer company' });
});
type RoleChange = z.infer<typeof roleChange>;

export function ChangeRoleForm({ user, isSelf, onDone, onCancel }: { user: UserRecord; isSelf: boolean; onDone: () => void; onCancel: () => void }) {
  const update = useUpdateUser();
  const [problems, setProblems] = useState<string[]>([]);
  const { register, handleSubmit, setError, watch, formState } = useForm<RoleChange>({
    resolver: zodResolver(roleChange),
    defaultValues: { role: user.role, customerId: user.customerId },
  });
  const role = watch('role');
  const e = formState.errors;

  const onSubmit = handleSubmit(async (values) => {
    setProblems([]);
    const change = updateUserRequest.parse({ role: values.role, customerId: values.role === 'customer' ? values.customerId : null });
    try {
      await update.mutateAsync({ id: user.id, change });
      onDone();
    } catch (err) {
      setProblems(applyServerErrors(err, setError, ['role', 'customerId']));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      <p className="text-graphite-700">
        {user.name} is now <strong>{ROLE_LABELS[user.role]}</strong>. A new role ends their open sessions; they sign in again.
      </p>
      {isSelf && <Alert kind="caution" title="This is your own account">Changing your own role signs you out.</Alert>}
      <FormProblems messages={problems} />
      <SelectField label="New role" error={e.role?.message} {...register('role')}>
        {ROLES.map((r) => (
          <option key={r} value={r}>
            {ROLE_LABELS[r]}
          </option>
        ))}
      </SelectField>
      {role === 'customer' && <CompanySelect error={e.customerId?.message} registration={register('customerId', { setValueAs: toCustomerId })} />}
      <Actions onCancel={onCancel} busy={update.isPending} submit="Change role" />
    </form>
  );
}

// ── reset password ──────────────────────────────────────────────────────────

const passwordReset = z
  .object({ password: updateUserRequest.shape.password.unwrap(), confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two entries differ' });
type PasswordReset = z.infer<typeof passwordReset>;

export function ResetPasswordForm({ user, onDone, onCancel }: { user: UserRecord; onDone: () => void; onCancel: () => void }) {
  const update = useUpdateUser();
  const [problems, setProblems] = useState<string[]>([]);
  const { register, handleSubmit, setError, formState } = useForm<PasswordReset>({
    resolver: zodResolver(passwordReset),
    defaultValues: { password: '', confirm: '' },
  });
  const e = formState.errors;
  const onSubmit = handleSubmit(async ({ password }) => {
    setProblems([]);
    try {
      await update.mutateAsync({ id: user.id, change: { password } });
      onDone();
    } catch (err) {
      setProblems(applyServerErrors(err, setError, ['password']));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      <p className="text-graphite-700">
        Sets a new password for {user.name} and ends their open sessions. Tell them the new password in private.
      </p>
      <FormProblems messages={problems} />
      <TextField label="New password" type="password" autoComplete="new-password" hint={`At least ${PASSWORD_MIN} characters.`} error={e.password?.message} {...register('password')} />
      <TextField label="New password again" type="password" autoComplete="new-password" error={e.confirm?.message} {...register('confirm')} />
      <Actions onCancel={onCancel} busy={update.isPending} submit="Set password" />
    </form>
  );
}

// ── deactivate / reactivate ─────────────────────────────────────────────────

export function ActiveForm({ user, onDone, onCancel }: { user: UserRecord; onDone: () => void; onCancel: () => void }) {
  const update = useUpdateUser();
  const [problems, setProblems] = useState<string[]>([]);
  const deactivating = user.active;
  const onSubmit = async (ev: FormEvent) => {
    ev.preventDefault();
    setProblems([]);
    try {
      await update.mutateAsync({ id: user.id, change: { active: !user.active } });
      onDone();
    } catch (err) {
      // 422 "rule" (the last active admin; yourself): the rule and its note, in plain words.
      setProblems(isApiError(err) ? [...new Set([err.message, ...Object.values(err.fields)])] : [errorMessage(err)]);
    }
  };
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3">
      <p className="text-graphite-700">
        {deactivating
          ? `${user.name} will no longer be able to sign in, and any open session ends now. Their records stay.`
          : `${user.name} will be able to sign in again with their current password.`}
      </p>
      <FormProblems messages={problems} />
      <Actions onCancel={onCancel} busy={update.isPending} submit={deactivating ? 'Deactivate' : 'Reactivate'} />
    </form>
  );
}
