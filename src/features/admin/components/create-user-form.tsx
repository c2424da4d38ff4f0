import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { createUserBody } from '../../../../server/schemas/admin';
import { siteRoles } from '../../../../server/schemas/auth';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { SelectField } from '../../../components/ui/select-field';
import { cardClass } from '../../../components/ui/styles';
import { TextField } from '../../../components/ui/text-field';
import { applyServerErrors } from '../../../lib/form-errors';
import { useCreateUser } from '../api/users';

type Input = z.input<typeof createUserBody>;
type Output = z.output<typeof createUserBody>;

export function CreateUserForm() {
  const create = useCreateUser();
  const [formError, setFormError] = useState<string | null>(null);
  const [created, setCreated] = useState<string | null>(null);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(createUserBody),
    // Least access by default: guests see only the projects they are invited to.
    defaultValues: { email: '', name: '', password: '', siteRole: 'guest' },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    setCreated(null);
    try {
      const user = await create.mutateAsync(values);
      setCreated(`Created the account of ${user.name} (${user.email}).`);
      form.reset();
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className={cardClass} aria-labelledby="new-user-heading">
      <h2 id="new-user-heading" className="text-base font-medium">
        New user
      </h2>
      {formError && <Notice tone="error">{formError}</Notice>}
      {created && <Notice tone="ok">{created}</Notice>}
      <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...form.register('email')} />
      <TextField label="Name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. Tell it to the person another way than this screen."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <SelectField label="Site role" error={errors.siteRole?.message} {...form.register('siteRole')}>
        {siteRoles.map((r) => (
          <option key={r} value={r}>
            {r}
          </option>
        ))}
      </SelectField>
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? 'Creating…' : 'Create user'}
        </Button>
      </div>
    </form>
  );
}
