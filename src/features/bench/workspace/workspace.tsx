import { createContext, useContext, useState, useSyncExternalStore, type ReactNode } from 'react';
import type { BenchState } from '../session/bench-session';
import { createStore, type Store } from '../session/store';

/** One run of the workspace as its session last published it. */
export interface PublishedRun {
  id: string;
  name: string;
  baseline: boolean;
  state: BenchState;
}

/** What the engineer chose in the comparison: the track compared, and the project whose targets apply. */
export interface ComparisonChoice {
  trackId: string | null;
  projectId: number | null;
}

interface Workspace {
  runs: Store<Record<string, PublishedRun>>;
  choice: Store<ComparisonChoice>;
  publish(run: PublishedRun): void;
  withdraw(id: string): void;
}

const WorkspaceContext = createContext<Workspace | null>(null);

/**
 * The Bench's workspace: the open recording (the baseline) and the runs compared with it, each a
 * session of its own that publishes its state here; the comparison reads them all.
 */
export function BenchWorkspace({ children }: { children: ReactNode }) {
  const [workspace] = useState((): Workspace => {
    const runs = createStore<Record<string, PublishedRun>>({});
    return {
      runs,
      choice: createStore<ComparisonChoice>({ trackId: null, projectId: null }),
      publish: (run) => runs.set((prev) => (prev[run.id]?.state === run.state && prev[run.id]?.name === run.name ? prev : { ...prev, [run.id]: run })),
      withdraw: (id) =>
        runs.set((prev) => {
          if (!(id in prev)) return prev;
          const next = { ...prev };
          delete next[id];
          return next;
        }),
    };
  });
  return <WorkspaceContext.Provider value={workspace}>{children}</WorkspaceContext.Provider>;
}

export function useWorkspace(): Workspace {
  const w = useContext(WorkspaceContext);
  if (!w) throw new Error('The comparison was rendered outside the Bench workspace.');
  return w;
}

/** Every published run, the baseline first. */
export function useWorkspaceRuns(): PublishedRun[] {
  const { runs } = useWorkspace();
  const all = useSyncExternalStore(runs.subscribe, runs.get);
  return Object.values(all).sort((a, b) => Number(b.baseline) - Number(a.baseline));
}

/** The comparison's choices, shared by its panel and the save (which keeps what the panel shows). */
export function useComparisonChoice(): [ComparisonChoice, (patch: Partial<ComparisonChoice>) => void] {
  const { choice } = useWorkspace();
  const value = useSyncExternalStore(choice.subscribe, choice.get);
  return [value, (patch) => choice.set((prev) => ({ ...prev, ...patch }))];
}
