import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import type { z } from 'zod';
import { signInBody } from '../../../server/schemas/auth';
import { Button } from '../../components/ui/button';
import { Logo } from '../../components/ui/logo';
import { Notice } from '../../components/ui/notice';
import { TextField } from '../../components/ui/text-field';
import { paths } from '../../config/paths';
import { useMe, useSignIn } from '../../features/auth/api/auth';
import { applyServerErrors } from '../../lib/form-errors';

type SignInInput = z.input<typeof signInBody>;
type SignInOutput = z.output<typeof signInBody>;

/** Only same-site paths are followed after sign-in, never another origin. */
function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : paths.projects;
}

export function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const { data: me } = useMe();
  const signIn = useSignIn();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<SignInInput, unknown, SignInOutput>({
    resolver: zodResolver(signInBody),
    defaultValues: { email: '', password: '' },
  });
  const { errors, isSubmitting } = form.formState;

  if (me) return <Navigate to={safeNext(params.get('next'))} replace />;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await signIn.mutateAsync(values);
      navigate(safeNext(params.get('next')), { replace: true });
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });

  return (
    <div className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-sm">
        <div className="mb-8 flex items-center gap-3 text-accent">
          <Logo className="h-9 w-9" />
          <div>
            <h1 className="text-2xl font-semibold text-mist-100">Fanlight</h1>
            <p className="text-sm text-mist-500">Noise and vibration of electric drives</p>
          </div>
        </div>
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-lg border border-ink-800 bg-ink-900 p-6">
          <h2 className="text-lg font-medium">Sign in</h2>
          {formError && <Notice tone="error">{formError}</Notice>}
          <TextField
            label="E-mail"
            type="email"
            autoComplete="username"
            autoFocus
            error={errors.email?.message}
            {...form.register('email')}
          />
          <TextField
            label="Password"
            type="password"
            autoComplete="current-password"
            error={errors.password?.message}
            {...form.register('password')}
          />
          <Button type="submit" disabled={isSubmitting}>
            {isSubmitting ? 'Signing in…' : 'Sign in'}
          </Button>
          <Link to={paths.forgotPassword} className="text-sm text-accent hover:underline">
            Forgot password?
          </Link>
        </form>
        <footer className="mt-6 text-center text-xs text-mist-500">
          <Link to={paths.outbox} className="hover:text-mist-300 hover:underline">
            Outbox (development)
          </Link>
        </footer>
      </div>
    </div>
  );
}
