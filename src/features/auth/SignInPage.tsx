import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate, useSearchParams } from 'react-router';
import type { z } from 'zod';
import { loginRequest } from '../../contracts/auth';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { TextField } from '../../components/Field';
import { Brand } from '../../components/Brand';
import { isApiError, safeNext } from '../../lib/api';
import { applyServerErrors } from '../../lib/forms';
import { useSignIn } from './api';

type FormIn = z.input<typeof loginRequest>;
type FormOut = z.output<typeof loginRequest>;

export function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const next = safeNext(params.get('next'));
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<FormIn, unknown, FormOut>({ resolver: zodResolver(loginRequest), defaultValues: { email: '', password: '' } });

  const onSubmit = handleSubmit(async (values) => {
    try {
      await signIn.mutateAsync(values);
      navigate(next, { replace: true });
    } catch (e) {
      if (isApiError(e) && e.status === 400) applyServerErrors(e, setError, ['email', 'password']);
    }
  });

  const failure = signIn.error;
  const problem =
    failure && isApiError(failure)
      ? failure.status === 401
        ? { title: 'Not signed in', text: failure.message }
        : failure.status === 429
          ? { title: 'Sign-in paused for this account', text: failure.message }
          : failure.status === 400
            ? null
            : { title: 'Could not sign in', text: failure.message }
      : failure
        ? { title: 'Could not sign in', text: failure.message }
        : null;

  return (
    <div className="flex min-h-screen flex-col bg-graphite-900">
      <div className="h-1 bg-copper-500" aria-hidden />
      <main className="flex flex-1 items-center justify-center px-4 py-10">
        <div className="w-full max-w-md">
          <div className="mb-6 flex justify-center">
            <Brand />
          </div>
          <div className="rounded-lg bg-white p-7 shadow-2xl">
            <h1 className="text-2xl font-bold text-graphite-950">Sign in</h1>
            <p className="mt-1 text-graphite-600">Orders, build sheets and work orders for the winding shop.</p>
            {next !== '/' && (
              <p className="mt-3 text-sm text-graphite-600">
                After signing in you go on to <span className="font-mono text-graphite-900">{next}</span>.
              </p>
            )}
            <form className="mt-5 flex flex-col gap-4" onSubmit={onSubmit} noValidate>
              {problem && (
                <Alert kind="fault" title={problem.title}>
                  {problem.text}
                </Alert>
              )}
              <TextField
                label="E-mail"
                type="email"
                autoComplete="username"
                autoFocus
                error={errors.email?.message}
                className="h-12 text-base"
                {...register('email')}
              />
              <TextField
                label="Password"
                type="password"
                autoComplete="current-password"
                error={errors.password?.message}
                className="h-12 text-base"
                {...register('password')}
              />
              <Button type="submit" variant="primary" size="lg" busy={signIn.isPending} className="mt-1 w-full">
                Sign in
              </Button>
            </form>
          </div>
          <p className="mt-5 text-center text-sm text-graphite-400">Forgotten your password? An administrator can set a new one.</p>
        </div>
      </main>
    </div>
  );
}
