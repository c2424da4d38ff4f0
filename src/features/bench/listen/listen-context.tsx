import { createContext, useContext, useEffect, useState, type ReactNode } from 'react';
import { useWorkspace } from '../workspace/workspace';
import { ListenController } from './listen-controller';

const ListenContext = createContext<ListenController | null>(null);

/** One player for the workspace: the open run and the runs compared with it are heard through it. */
export function ListenProvider({ children }: { children: ReactNode }) {
  const { runs } = useWorkspace();
  const [controller] = useState(() => new ListenController(runs));
  useEffect(() => controller.attach(), [controller]);
  return <ListenContext.Provider value={controller}>{children}</ListenContext.Provider>;
}

export function useListen(): ListenController {
  const c = useContext(ListenContext);
  if (!c) throw new Error('The player was rendered outside the Bench workspace.');
  return c;
}

/** The player where there is one (the map is drawn outside the Bench too). */
export const useListenIfAny = (): ListenController | null => useContext(ListenContext);
