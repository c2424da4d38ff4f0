import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { inviteBody, projectRoles } from '../../../../server/schemas/projects';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { applyServerErrors } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { useInvite } from '../api/members';

type Input = z.input<typeof inviteBody>;
type Output = z.output<typeof inviteBody>;

export function InviteForm({ projectId }: { projectId: number }) {
  const invite = useInvite(projectId);
  const [formError, setFormError] = useState<string | null>(null);
  const [sent, setSent] = useState<string | null>(null);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(inviteBody),
    defaultValues: { email: '', role: 'engineer' },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    setSent(null);
    try {
      const { invitation, mailSent } = await invite.mutateAsync(values);
      if (mailSent) {
        setSent(`We e-mailed an invitation to ${invitation.email}. The link works until ${formatDateTime(invitation.expiresAt)}.`);
      } else {
        setFormError(`The invitation for ${invitation.email} is saved, but the mail could not be sent. Check the mail settings, then revoke it and invite again.`);
      }
      form.reset({ email: '', role: values.role });
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-labelledby="invite-heading">
      <h3 id="invite-heading" className="text-sm font-medium text-mist-300">
        Invite someone
      </h3>
      {formError && <Notice tone="error">{formError}</Notice>}
      {sent && <Notice tone="ok">{sent}</Notice>}
      <div className="flex flex-wrap items-start gap-3">
        <TextField
          label="E-mail"
          type="email"
          className="min-w-56 flex-1"
          error={errors.email?.message}
          {...form.register('email')}
        />
        <SelectField label="Role" error={errors.role?.message} {...form.register('role')}>
          {projectRoles.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </SelectField>
      </div>
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? 'Sending…' : 'Send invitation'}
        </Button>
      </div>
    </form>
  );
}
