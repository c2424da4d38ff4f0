import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import type { z } from 'zod';
import { createProjectBody } from '../../../../server/schemas/projects';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { cardClass } from '../../../components/ui/styles';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { paths } from '../../../config/paths';
import { applyServerErrors } from '../../../lib/form-errors';
import { useCreateProject } from '../api/projects';

type Input = z.input<typeof createProjectBody>;
type Output = z.output<typeof createProjectBody>;

export function CreateProjectForm() {
  const create = useCreateProject();
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(createProjectBody),
    defaultValues: { name: '', description: '' },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      const project = await create.mutateAsync(values);
      navigate(paths.project(project.id));
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className={cardClass} aria-labelledby="new-project-heading">
      <h2 id="new-project-heading" className="text-base font-medium">
        New project
      </h2>
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextField label="Name" error={errors.name?.message} {...form.register('name')} />
      <TextAreaField label="Description" error={errors.description?.message} {...form.register('description')} />
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? 'Creating…' : 'Create project'}
        </Button>
      </div>
    </form>
  );
}
