import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import type { z } from 'zod';
import { passwordResetRequestBody } from '../../../server/schemas/auth';
import { PublicFrame } from '../../components/layouts/public-frame';
import { Button } from '../../components/ui/button';
import { Notice } from '../../components/ui/notice';
import { cardClass, linkClass } from '../../components/ui/styles';
import { TextField } from '../../components/ui/text-field';
import { paths } from '../../config/paths';
import { useRequestPasswordReset } from '../../features/auth/api/password-reset';
import { applyServerErrors } from '../../lib/form-errors';

type Input = z.input<typeof passwordResetRequestBody>;
type Output = z.output<typeof passwordResetRequestBody>;

export function ForgotPasswordPage() {
  const request = useRequestPasswordReset();
  const [sent, setSent] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(passwordResetRequestBody),
    defaultValues: { email: '' },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await request.mutateAsync(values);
      setSent(true);
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });

  return (
    <PublicFrame>
      <form onSubmit={onSubmit} noValidate className={cardClass}>
        <h1 className="text-lg font-medium">Reset your password</h1>
        {sent ? (
          <Notice tone="ok">
            If an account exists for that e-mail, we sent a link to reset the password. It works for one hour.
          </Notice>
        ) : (
          <>
            <p className="text-sm text-mist-500">Enter the e-mail of your account. We send you a link to choose a new password.</p>
            {formError && <Notice tone="error">{formError}</Notice>}
            <TextField
              label="E-mail"
              type="email"
              autoComplete="username"
              autoFocus
              error={errors.email?.message}
              {...form.register('email')}
            />
            <Button type="submit" disabled={isSubmitting}>
              {isSubmitting ? 'Sending…' : 'Send the link'}
            </Button>
          </>
        )}
        <Link to={paths.signIn} className={`text-sm ${linkClass}`}>
          Back to sign in
        </Link>
      </form>
    </PublicFrame>
  );
}
