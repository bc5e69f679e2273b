/** The React binding of the workbench: a context, and a selector hook per store. */
import { createContext, useContext, type ReactNode } from 'react';
import { useStore } from 'zustand';
import type { DocumentState } from '../state/documentStore';
import type { JobsState } from '../state/jobsStore';
import type { PoseState } from '../state/poseStore';
import type { StudyState } from '../state/studyStore';
import type { UiState } from '../state/uiStore';
import type { Workbench, WorkbenchActions } from '../state/workbench';

const WorkbenchContext = createContext<Workbench | null>(null);

export function WorkbenchProvider({ workbench, children }: { workbench: Workbench; children: ReactNode }) {
  return <WorkbenchContext.Provider value={workbench}>{children}</WorkbenchContext.Provider>;
}

export function useWorkbenchApi(): Workbench {
  const wb = useContext(WorkbenchContext);
  if (wb === null) throw new Error('useWorkbenchApi outside <WorkbenchProvider>');
  return wb;
}

// Each hook subscribes to a slice of one store; selectors return primitives or stable references.

export function useDocument<U>(selector: (s: DocumentState) => U): U {
  return useStore(useWorkbenchApi().document, selector);
}

export function usePose<U>(selector: (s: PoseState) => U): U {
  return useStore(useWorkbenchApi().pose, selector);
}

export function useUi<U>(selector: (s: UiState) => U): U {
  return useStore(useWorkbenchApi().ui, selector);
}

export function useJobs<U>(selector: (s: JobsState) => U): U {
  return useStore(useWorkbenchApi().jobs.store, selector);
}

export function useStudies<U>(selector: (s: StudyState) => U): U {
  return useStore(useWorkbenchApi().studies, selector);
}

export function useActions(): WorkbenchActions {
  return useWorkbenchApi().actions;
}
