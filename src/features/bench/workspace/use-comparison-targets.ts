import { useProjects } from '../../projects/api/projects';
import { useProjectTargets } from '../../projects/api/targets';
import { useComparisonChoice } from './workspace';

/**
 * The project whose targets the comparison checks: the one the Bench was opened for, else the first
 * the engineer is a member of; they may pick another.
 */
export function useComparisonTargets(preferredProjectId: number | null) {
  const { data: projects } = useProjects();
  const [choice, choose] = useComparisonChoice();
  const open = (projects ?? []).filter((p) => !p.archived);
  const projectId = choice.projectId ?? (open.find((p) => p.id === preferredProjectId) ?? open[0])?.id ?? null;
  const targets = useProjectTargets(projectId);
  return { projects: open, projectId, setProjectId: (id: number) => choose({ projectId: id }), targets: targets.data, error: targets.error };
}
