/** The React binding of the workbench store: a context and a selector hook. */
import { createContext, useContext, type ReactNode } from 'react';
import { useStore } from 'zustand';
import type { Workbench, WorkbenchActions, WorkbenchState } from '../model/workbenchStore';

const WorkbenchContext = createContext<Workbench | null>(null);

export function WorkbenchProvider({ workbench, children }: { workbench: Workbench; children: ReactNode }) {
  return <WorkbenchContext.Provider value={workbench}>{children}</WorkbenchContext.Provider>;
}

export function useWorkbenchApi(): Workbench {
  const wb = useContext(WorkbenchContext);
  if (wb === null) throw new Error('useWorkbench outside <WorkbenchProvider>');
  return wb;
}

/** Subscribe to a slice of the state; return primitives or stable references from the selector. */
export function useWorkbench<U>(selector: (s: WorkbenchState) => U): U {
  return useStore(useWorkbenchApi().store, selector);
}

export function useActions(): WorkbenchActions {
  return useWorkbenchApi().actions;
}
