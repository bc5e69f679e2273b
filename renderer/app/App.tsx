/**
 * The workbench's layout and its keyboard shortcuts. Three zones in the order of the work:
 * ride the vehicle (the slim left column: lean or ride inputs, handlebar, travel, playback),
 * the vehicle itself (the 3D view, the parts a finding is about marked in it, the plots and
 * every reading of the pose as the strip's tabs), and what is wrong with how to fix it (the
 * right column: findings first, each opening into its fix; all hardpoints, studies and
 * settings one tab away).
 */
import { lazy, Suspense, useEffect } from 'react';
import { ReadoutPanel } from '../panels/ReadoutPanel';
import { PosePanel } from '../panels/PosePanel';
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
import { FixColumn } from './FixColumn';
import { FixJobsProvider } from './fixJobs';

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
    <FixJobsProvider>
      <div className="app" style={sizeStyle(layout.sizes)}>
        <TopBar />
        <aside className="side left-side ride-column" aria-label="Ride: how the vehicle is ridden now">
          <PosePanel />
          <PlaybackPanel controller={playback} />
        </aside>
        <Splitter orientation="vertical" label="Width of the ride column" size={measure('.left-side', 'offsetWidth')} sign={1} onSize={(px) => layout.setSide('leftPx', px)} onReset={() => layout.reset('leftPx')} testId="split-left" />
        <main className="centre" aria-label="The vehicle">
          <Viewport />
          <Splitter orientation="horizontal" label="Height of the plots" size={measure('.plots', 'offsetHeight')} sign={-1} onSize={layout.setPlots} onReset={() => layout.reset('plotsPx')} testId="split-plots" />
          {plotsReady ? (
            <Suspense fallback={<section className="plots" aria-label="Plots" aria-busy="true" />}>
              <PlotsPanel numbers={<ReadoutPanel />} />
            </Suspense>
          ) : (
            <section className="plots" aria-label="Plots" aria-busy="true" />
          )}
        </main>
        <Splitter orientation="vertical" label="Width of the fix column" size={measure('.right-side', 'offsetWidth')} sign={-1} onSize={(px) => layout.setSide('rightPx', px)} onReset={() => layout.reset('rightPx')} testId="split-right" />
        <FixColumn />
        <SafetyCaution />
        <Dialogs />
      </div>
    </FixJobsProvider>
  );
}
