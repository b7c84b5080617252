import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { changePasswordRequest } from '../../contracts/users';
import { FormProblems } from '../../components/Alert';
import { Button } from '../../components/Button';
import { TextField } from '../../components/Field';
import { PageHeader, Panel } from '../../components/Panel';
import { applyServerErrors } from '../../lib/forms';
import { useCurrentUser } from '../../lib/session';
import { useChangePassword } from './api';

/** The form adds a second typing of the new password; the server gets the contract's two fields. */
const form = z
  .object({ currentPassword: z.string(), newPassword: z.string(), repeat: z.string() })
  .superRefine((v, ctx) => {
    const r = changePasswordRequest.safeParse(v);
    if (!r.success) for (const i of r.error.issues) ctx.addIssue({ code: 'custom', path: i.path, message: i.message });
    if (v.repeat !== v.newPassword) ctx.addIssue({ code: 'custom', path: ['repeat'], message: 'The two new passwords differ' });
  });
type FormValues = z.infer<typeof form>;

/**
 * Shown instead of every screen while the signed-in user must choose their own password (the
 * first admin after `npm run setup`): the server refuses everything else until then.
 */
export function ChangePasswordPage() {
  const user = useCurrentUser();
  const change = useChangePassword();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<FormValues>({ resolver: zodResolver(form), defaultValues: { currentPassword: '', newPassword: '', repeat: '' } });
  const problems = change.error ? applyServerErrors(change.error, () => {}, []) : [];

  const onSubmit = handleSubmit(async ({ currentPassword, newPassword }) => {
    try {
      await change.mutateAsync({ currentPassword, newPassword });
    } catch (e) {
      applyServerErrors(e, setError, ['currentPassword', 'newPassword']);
    }
  });

  return (
    <div className="mx-auto max-w-lg">
      <PageHeader
        title="Choose your own password"
        lead={`Welcome, ${user.name}. The password you signed in with was chosen when this installation was set up; choose one only you know before you go on.`}
      />
      <Panel>
        <form className="flex flex-col gap-4" onSubmit={onSubmit} noValidate>
          {change.error && !Object.keys((change.error as { fields?: object }).fields ?? {}).length && <FormProblems messages={problems} />}
          <TextField label="Current password" type="password" autoComplete="current-password" autoFocus error={errors.currentPassword?.message} {...register('currentPassword')} />
          <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters" error={errors.newPassword?.message} {...register('newPassword')} />
          <TextField label="New password again" type="password" autoComplete="new-password" error={errors.repeat?.message} {...register('repeat')} />
          <div>
            <Button type="submit" variant="primary" busy={change.isPending}>
              Save the new password
            </Button>
          </div>
        </form>
      </Panel>
    </div>
  );
}
