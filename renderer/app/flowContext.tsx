/** The document flow (files, autosave, recovery) for React components. */
import { createContext, useContext, type ReactNode } from 'react';
import type { DocumentFlow } from '../files/documentFlow';

const FlowContext = createContext<DocumentFlow | null>(null);

export function FlowProvider({ flow, children }: { flow: DocumentFlow; children: ReactNode }) {
  return <FlowContext.Provider value={flow}>{children}</FlowContext.Provider>;
}

export function useFlow(): DocumentFlow {
  const f = useContext(FlowContext);
  if (f === null) throw new Error('useFlow outside <FlowProvider>');
  return f;
}
