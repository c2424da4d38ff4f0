import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useSearchParams } from 'react-router-dom';
import type { z } from 'zod';
import { PublicFrame } from '../../components/layouts/public-frame';
import { Button } from '../../components/ui/button';
import { Notice } from '../../components/ui/notice';
import { cardClass, linkClass } from '../../components/ui/styles';
import { TextField } from '../../components/ui/text-field';
import { paths } from '../../config/paths';
import { useConfirmPasswordReset } from '../../features/auth/api/password-reset';
import { newPasswordForm } from '../../features/auth/forms';
import { ApiError } from '../../lib/api-client';
import { applyServerErrors } from '../../lib/form-errors';

type Input = z.input<typeof newPasswordForm>;
type Output = z.output<typeof newPasswordForm>;

export function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token');
  return (
    <PublicFrame>
      {token ? (
        <ResetForm token={token} />
      ) : (
        <div className={cardClass}>
          <h1 className="text-lg font-medium">Choose a new password</h1>
          <Notice tone="error">This link is incomplete. Ask for a new one.</Notice>
          <Link to={paths.forgotPassword} className={`text-sm ${linkClass}`}>
            Ask for a new link
          </Link>
        </div>
      )}
    </PublicFrame>
  );
}

function ResetForm({ token }: { token: string }) {
  const confirm = useConfirmPasswordReset();
  const [done, setDone] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(newPasswordForm),
    defaultValues: { password: '', repeat: '' },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async ({ password }) => {
    setFormError(null);
    try {
      await confirm.mutateAsync({ token, password });
      setDone(true);
    } catch (e) {
      const message = applyServerErrors(e, form.setError);
      // The token is no field of this form: its message is the one that explains the failure.
      setFormError((e instanceof ApiError && e.fields.token) || message);
    }
  });

  if (done) {
    return (
      <div className={cardClass}>
        <h1 className="text-lg font-medium">Password changed</h1>
        <Notice tone="ok">Your new password is set. Sign in with it.</Notice>
        <Link to={paths.signIn} className={`text-sm ${linkClass}`}>
          Sign in
        </Link>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className={cardClass}>
      <h1 className="text-lg font-medium">Choose a new password</h1>
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        autoFocus
        hint="At least 10 characters."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField
        label="Repeat the new password"
        type="password"
        autoComplete="new-password"
        error={errors.repeat?.message}
        {...form.register('repeat')}
      />
      <Button type="submit" disabled={isSubmitting}>
        {isSubmitting ? 'Saving…' : 'Set the new password'}
      </Button>
      <Link to={paths.forgotPassword} className={`text-sm ${linkClass}`}>
        Link expired? Ask for a new one.
      </Link>
    </form>
  );
}
