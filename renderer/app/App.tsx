/** The workbench's layout and its keyboard shortcuts. */
import { lazy, Suspense, useEffect } from 'react';
import { DesignSheet } from '../panels/DesignSheet';
import { HardpointTable } from '../panels/HardpointTable';
import { StudiesPanel } from '../studies/StudiesPanel';
import { AlertsPanel, ReadoutPanel } from '../panels/ReadoutPanel';
import { PosePanel } from '../panels/PosePanel';
import { LimitsPanel } from '../panels/LimitsPanel';
import { PlaybackPanel } from '../panels/PlaybackPanel';
import type { PlaybackController } from '../panels/playback';
import { Viewport } from '../viewport/Viewport';
import { Dialogs } from './Dialogs';
import { SafetyCaution } from './SafetyCaution';
import { TopBar } from './TopBar';
import { useActions } from './workbenchContext';
import { Splitter } from './Splitter';
import { usePanelSizes } from './usePanelSizes';
import { sizeStyle } from '../model/panelSizes';
import { useAfterFirstFrame } from '../charts/afterFirstFrame';

/** The charts (ECharts) load after the workbench is up, in their own chunk. */
const PlotsPanel = lazy(() => import('../charts/PlotsPanel').then((m) => ({ default: m.PlotsPanel })));

/** Whether a key press belongs to a text field being typed in (its own undo applies). */
function typingInField(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target instanceof HTMLTextAreaElement) return true;
  return target instanceof HTMLInputElement && target.type === 'text' && target.dataset.draft === 'true';
}

export function App({ playback }: { playback: PlaybackController }) {
  const actions = useActions();
  const plotsReady = useAfterFirstFrame();
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const mod = e.ctrlKey || e.metaKey;
      if (e.key === 'Escape' && !typingInField(e.target) && !document.querySelector('.modal')) {
        actions.select(null);
        return;
      }
      if (!mod || typingInField(e.target)) return;
      const key = e.key.toLowerCase();
      if (key === 'z' && !e.shiftKey) {
        e.preventDefault();
        actions.undo();
      } else if ((key === 'z' && e.shiftKey) || key === 'y') {
        e.preventDefault();
        actions.redo();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [actions]);

  const layout = usePanelSizes();
  const measure = (selector: string, dim: 'offsetWidth' | 'offsetHeight') => () => (document.querySelector(selector) as HTMLElement | null)?.[dim] ?? 0;

  return (
    <div className="app" style={sizeStyle(layout.sizes)}>
      <TopBar />
      <aside className="side left-side" aria-label="Pose and readings">
        <PosePanel />
        <PlaybackPanel controller={playback} />
        <AlertsPanel />
        <LimitsPanel />
        <ReadoutPanel />
      </aside>
      <Splitter orientation="vertical" label="Width of the left column" size={measure('.left-side', 'offsetWidth')} sign={1} onSize={(px) => layout.setSide('leftPx', px)} onReset={() => layout.reset('leftPx')} testId="split-left" />
      <main className="centre">
        <Viewport />
        <Splitter orientation="horizontal" label="Height of the plots" size={measure('.plots', 'offsetHeight')} sign={-1} onSize={layout.setPlots} onReset={() => layout.reset('plotsPx')} testId="split-plots" />
        {plotsReady ? (
          <Suspense fallback={<section className="plots" aria-label="Plots" aria-busy="true" />}>
            <PlotsPanel />
          </Suspense>
        ) : (
          <section className="plots" aria-label="Plots" aria-busy="true" />
        )}
      </main>
      <Splitter orientation="vertical" label="Width of the right column" size={measure('.right-side', 'offsetWidth')} sign={-1} onSize={(px) => layout.setSide('rightPx', px)} onReset={() => layout.reset('rightPx')} testId="split-right" />
      <aside className="side right-side" aria-label="Design">
        <HardpointTable />
        <StudiesPanel />
        <DesignSheet />
      </aside>
      <SafetyCaution />
      <Dialogs />
    </div>
  );
}
