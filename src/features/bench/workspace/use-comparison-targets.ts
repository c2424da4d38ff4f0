import { useState } from 'react';
import { useProjects } from '../../projects/api/projects';
import { useProjectTargets } from '../../projects/api/targets';

/**
 * The project whose targets the comparison checks: the one the Bench was opened for, else the first
 * the engineer is a member of; they may pick another.
 */
export function useComparisonTargets(preferredProjectId: number | null) {
  const { data: projects } = useProjects();
  const [chosen, setChosen] = useState<number | null>(null);
  const open = (projects ?? []).filter((p) => !p.archived);
  const projectId = chosen ?? (open.find((p) => p.id === preferredProjectId) ?? open[0])?.id ?? null;
  const targets = useProjectTargets(projectId);
  return { projects: open, projectId, setProjectId: setChosen, targets: targets.data, error: targets.error };
}
