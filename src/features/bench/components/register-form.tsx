import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { calibrationProblem, type ChannelSetup } from '../../../../workers/io/channel-setup';
import { registerRecordingBody } from '../../../../server/schemas/recordings';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { SelectField } from '../../../components/ui/select-field';
import { linkClass } from '../../../components/ui/styles';
import { paths } from '../../../config/paths';
import { ApiError } from '../../../lib/api-client';
import { useProjects } from '../../projects/api/projects';
import { useRegisterRecording } from '../../projects/api/recordings';
import type { LibraryEntry } from '../../library/api/library-store';

type Outcome = { tone: 'ok' | 'error'; message: string; projectId?: number };

/** What would keep the server from taking this description, in the engineer's words. */
export function setupProblems(setup: ChannelSetup[]): string[] {
  return setup.flatMap((c) => {
    const label = `Channel ${c.index + 1}${c.name.trim() ? ` (${c.name.trim()})` : ''}`;
    const problems: string[] = [];
    if (!c.name.trim()) problems.push(`${label} has no name.`);
    const cal = calibrationProblem(c.calibration);
    if (cal) problems.push(`${label}: ${cal}`);
    return problems;
  });
}

export function RegisterForm({
  entry,
  setup,
  preferredProjectId,
}: {
  entry: LibraryEntry;
  setup: ChannelSetup[];
  preferredProjectId: number | null;
}) {
  const { data: projects, isPending, error } = useProjects();
  const register = useRegisterRecording();
  const [chosen, setChosen] = useState<number | null>(null);
  const [outcome, setOutcome] = useState<Outcome | null>(null);

  if (isPending) return <p className="text-sm text-mist-500">Loading your projects…</p>;
  if (error) return <Notice tone="error">{error.message}</Notice>;

  const eligible = projects.filter((p) => !p.archived && (p.role === 'engineer' || p.role === 'lead'));
  const preferred = projects.find((p) => p.id === preferredProjectId);
  const projectId =
    chosen ?? (preferred && eligible.includes(preferred) ? preferred.id : (eligible[0]?.id ?? null));
  const project = eligible.find((p) => p.id === projectId);
  const preferredNote =
    preferred && !eligible.includes(preferred)
      ? preferred.archived
        ? `${preferred.name} is archived, so nothing can be registered with it.`
        : `You are a ${preferred.role} in ${preferred.name}; only its engineers and leads register recordings.`
      : null;

  if (eligible.length === 0) {
    return (
      <div className="flex flex-col gap-3">
        {preferredNote && <Notice>{preferredNote}</Notice>}
        <p className="text-sm text-mist-500" data-testid="register-none">
          You are not an engineer or lead in any open project, so you cannot register recordings yet. A project lead
          can invite you.
        </p>
      </div>
    );
  }

  const onSubmit = async (e: FormEvent) => {
    e.preventDefault();
    setOutcome(null);
    if (!project) return;
    const problems = setupProblems(setup);
    if (problems.length > 0) {
      setOutcome({ tone: 'error', message: `Fix the channel setup first. ${problems.join(' ')}` });
      return;
    }
    const parsed = registerRecordingBody.safeParse({
      name: entry.name,
      fingerprint: entry.fingerprint,
      format: entry.format,
      sampleRateHz: entry.sampleRateHz,
      durationS: entry.durationS,
      channels: setup.map(({ index, name, quantity, unit, calibration }) => ({ index, name, quantity, unit, calibration })),
    });
    if (!parsed.success) {
      setOutcome({ tone: 'error', message: parsed.error.issues.map((i) => i.message).join(' ') });
      return;
    }
    try {
      const { created } = await register.mutateAsync({ projectId: project.id, body: parsed.data });
      setOutcome({
        tone: 'ok',
        projectId: project.id,
        message: created
          ? `Registered ${entry.name} with ${project.name}.`
          : `${project.name} already had ${entry.name}; its description is now updated.`,
      });
    } catch (err) {
      const message =
        err instanceof ApiError && err.status === 403
          ? `Only the engineers and leads of ${project.name} can register recordings in it.`
          : err instanceof Error
            ? err.message
            : String(err);
      setOutcome({ tone: 'error', message });
    }
  };

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      {preferredNote && <Notice>{preferredNote}</Notice>}
      <div className="flex flex-wrap items-end gap-3">
        <SelectField
          label="Project"
          className="min-w-56"
          value={projectId ?? ''}
          onChange={(e) => {
            setChosen(Number(e.target.value));
            setOutcome(null);
          }}
        >
          {eligible.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </SelectField>
        <Button type="submit" disabled={register.isPending}>
          {register.isPending ? 'Registering…' : 'Register'}
        </Button>
      </div>
      {outcome && (
        <Notice tone={outcome.tone}>
          {outcome.message}
          {outcome.projectId !== undefined && (
            <>
              {' '}
              <Link to={paths.project(outcome.projectId)} className={linkClass}>
                See it in the project
              </Link>
            </>
          )}
        </Notice>
      )}
      <p className="text-xs text-mist-500">
        Sends the name, fingerprint, format, sample rate, duration and channel setup. The samples stay here.
      </p>
    </form>
  );
}
