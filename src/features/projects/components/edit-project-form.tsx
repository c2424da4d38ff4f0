import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { updateProjectBody, type ProjectDetail } from '../../../../server/schemas/projects';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { cardClass } from '../../../components/ui/styles';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { applyServerErrors } from '../../../lib/form-errors';
import { useUpdateProject } from '../api/projects';

type Input = z.input<typeof updateProjectBody>;
type Output = z.output<typeof updateProjectBody>;

export function EditProjectForm({ project, onDone }: { project: ProjectDetail; onDone: () => void }) {
  const update = useUpdateProject(project.id);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(updateProjectBody),
    defaultValues: { name: project.name, description: project.description },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await update.mutateAsync(values);
      onDone();
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className={`${cardClass} max-w-xl`} aria-label="Edit the project">
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextField label="Name" autoFocus error={errors.name?.message} {...form.register('name')} />
      <TextAreaField label="Description" error={errors.description?.message} {...form.register('description')} />
      <div className="flex gap-2">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? 'Saving…' : 'Save'}
        </Button>
        <Button type="button" variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
