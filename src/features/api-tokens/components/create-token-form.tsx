import { useState, type FormEvent } from 'react';
import { API_TOKEN_MAX_DAYS } from '../../../../server/schemas/api-tokens';
import type { ProjectRole } from '../../../../server/schemas/projects';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { ApiError } from '../../../lib/api-client';
import { useProjects } from '../../projects/api/projects';
import { grantableRoles, useCreateApiToken } from '../api/api-tokens';
import { TokenSecret } from './token-secret';

/**
 * A new personal token: a name, one of the user's projects, a role up to theirs there, and a lifetime in
 * days. The secret comes back once and is shown once, under the form, until the user closes it.
 */
export function CreateTokenForm() {
  const { data: projects } = useProjects();
  const create = useCreateApiToken();
  const open = (projects ?? []).filter((p) => !p.archived);
  const [name, setName] = useState('');
  const [projectId, setProjectId] = useState<number | null>(null);
  const [role, setRole] = useState<ProjectRole>('engineer');
  const [days, setDays] = useState('30');
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [secret, setSecret] = useState<{ secret: string; name: string } | null>(null);

  const project = open.find((p) => p.id === projectId) ?? open[0];
  const roles = project ? grantableRoles(project.role) : [];
  const shownRole = roles.includes(role) ? role : (roles[roles.length - 1] ?? 'viewer');

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setFormError(null);
    const errors: Record<string, string> = {};
    const expiresInDays = Number(days);
    if (!name.trim()) errors.name = 'Give the token a name, such as the machine or script that uses it.';
    if (!Number.isInteger(expiresInDays) || expiresInDays < 1 || expiresInDays > API_TOKEN_MAX_DAYS) errors.expiresInDays = `A token lasts 1 to ${API_TOKEN_MAX_DAYS} whole days.`;
    if (!project) errors.projectId = 'You are a member of no open project to give a token for.';
    setFieldErrors(errors);
    if (Object.keys(errors).length > 0 || !project) return;
    try {
      const made = await create.mutateAsync({ name: name.trim(), projectId: project.id, role: shownRole, expiresInDays });
      setSecret({ secret: made.secret, name: made.token.name });
      setName('');
    } catch (err) {
      if (err instanceof ApiError) setFieldErrors(err.fields);
      setFormError(err instanceof Error ? err.message : 'The token could not be made.');
    }
  };

  return (
    <div className="flex flex-col gap-3">
      <form onSubmit={submit} noValidate className="flex flex-col gap-3" aria-labelledby="new-token-heading">
        <h3 id="new-token-heading" className="text-sm font-medium text-mist-300">
          New token
        </h3>
        {formError && <Notice tone="error">{formError}</Notice>}
        <div className="flex flex-wrap items-start gap-3">
          <TextField label="Token name" className="min-w-48 flex-1" value={name} onChange={(e) => setName(e.target.value)} error={fieldErrors.name} placeholder="test-rig PC" />
          <SelectField label="Project" value={project?.id ?? ''} onChange={(e) => setProjectId(Number(e.target.value))} error={fieldErrors.projectId}>
            {open.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </SelectField>
          <SelectField label="Role" value={shownRole} onChange={(e) => setRole(e.target.value as ProjectRole)} error={fieldErrors.role}>
            {roles.map((r) => (
              <option key={r} value={r}>
                {r}
              </option>
            ))}
          </SelectField>
          <TextField
            label="Expires after (days)"
            type="number"
            min={1}
            max={API_TOKEN_MAX_DAYS}
            className="w-40"
            value={days}
            onChange={(e) => setDays(e.target.value)}
            error={fieldErrors.expiresInDays}
          />
        </div>
        <p className="text-xs text-mist-500">A token acts for you in one project, with at most the role you hold there now; if your role is lowered, so is the token’s.</p>
        <div>
          <Button type="submit" disabled={create.isPending || !project}>
            {create.isPending ? 'Making the token…' : 'Make token'}
          </Button>
        </div>
      </form>
      {secret && <TokenSecret name={secret.name} secret={secret.secret} onClose={() => setSecret(null)} />}
    </div>
  );
}
