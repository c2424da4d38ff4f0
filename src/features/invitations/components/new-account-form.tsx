import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import type { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { cardClass, linkClass } from '../../../components/ui/styles';
import { TextField } from '../../../components/ui/text-field';
import { paths, signInThen } from '../../../config/paths';
import { ApiError } from '../../../lib/api-client';
import { applyServerErrors } from '../../../lib/form-errors';
import { newAccountForm } from '../../auth';
import { useAcceptInvitation, type AcceptAnswer } from '../api/invitations';

type Input = z.input<typeof newAccountForm>;
type Output = z.output<typeof newAccountForm>;

/** Accepting without an account: the invitation creates it (with the invited e-mail) and signs it in. */
export function NewAccountForm({
  token,
  email,
  onAccepted,
}: {
  token: string;
  email: string;
  onAccepted: (answer: AcceptAnswer) => void;
}) {
  const accept = useAcceptInvitation(token);
  const [formError, setFormError] = useState<string | null>(null);
  const [accountExists, setAccountExists] = useState(false);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(newAccountForm),
    defaultValues: { name: '', password: '', repeat: '' },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async ({ name, password }) => {
    setFormError(null);
    try {
      onAccepted(await accept.mutateAsync({ name, password }));
    } catch (e) {
      setAccountExists(e instanceof ApiError && e.status === 409);
      setFormError(applyServerErrors(e, form.setError));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className={cardClass}>
      <h2 className="text-base font-medium">Create your account</h2>
      <p className="text-sm text-mist-500">
        Your account uses the invited e-mail, <span className="text-mist-300">{email}</span>.
      </p>
      {formError && <Notice tone="error">{formError}</Notice>}
      {accountExists && (
        <Link to={signInThen(paths.invitation(token))} className={`text-sm ${linkClass}`}>
          Sign in, then accept
        </Link>
      )}
      <TextField label="Name" autoComplete="name" autoFocus error={errors.name?.message} {...form.register('name')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField
        label="Repeat the password"
        type="password"
        autoComplete="new-password"
        error={errors.repeat?.message}
        {...form.register('repeat')}
      />
      <Button type="submit" disabled={isSubmitting}>
        {isSubmitting ? 'Creating the account…' : 'Create the account and accept'}
      </Button>
    </form>
  );
}
