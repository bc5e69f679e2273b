/**
 * The studies behind "What's wrong -> Fix", shared by the findings list, the fix view and the
 * full hardpoint table: the operating region's check and the rates per mm (sensitivity), each
 * run in its own worker. After an edit they run by themselves, one after the other, once the
 * plots of that edit are drawn (or after a quiet spell when no plot is being computed), so
 * they never hold up the curves; an edit stops them if they are still running for the design
 * before it. The buttons stay as "run again".
 */
import { createContext, useContext, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { useDocument, useJobs, usePose, useUi } from './workbenchContext';
import { useStudyJob } from '../studies/useStudyJob';
import { useSensitivity } from '../studies/useSensitivity';
import type { CheckData } from '../workers/studyJobs';
import type { DesignFile } from '../../core/design/types';

/** How long after an edit the check starts even if the plots have not finished, ms. */
export const FIX_JOBS_FALLBACK_MS = 1500;

type CheckJob = ReturnType<typeof useStudyJob<'check'>>;
type RatesJob = ReturnType<typeof useSensitivity>;

export interface FixJobs {
  check: CheckJob;
  rates: RatesJob;
  /** The last check that finished (kept while the next one runs, so the findings do not vanish at each edit); null before the first. */
  lastCheck: { data: CheckData; forDesign: DesignFile } | null;
}

const FixJobsContext = createContext<FixJobs | null>(null);
// Narrower slices, so a panel that needs only the rates (the hardpoint table) or only the last
// finished check (the findings count) is not rendered again at each progress step of the other job.
const FixRatesContext = createContext<RatesJob | null>(null);
const LastCheckContext = createContext<FixJobs['lastCheck'] | undefined>(undefined);

/** The shared jobs, or null outside the provider (a panel then runs its own on request). */
export function useFixJobs(): FixJobs | null {
  return useContext(FixJobsContext);
}

/** The shared rates job alone, or null outside the provider. */
export function useFixRates(): RatesJob | null {
  return useContext(FixRatesContext);
}

/** The last check that finished (null before the first), or undefined outside the provider. */
export function useLastCheck(): FixJobs['lastCheck'] | undefined {
  return useContext(LastCheckContext);
}

export function FixJobsProvider({ children, auto = true }: { children: ReactNode; auto?: boolean }) {
  const design = useDocument((s) => s.design);
  const revision = useDocument((s) => s.revision);
  const valid = usePose((s) => s.resolved !== null);
  const dragging = useUi((s) => s.dragging);
  const plotsBusy = useJobs((s) => s.curves.progress !== null || s.map.progress !== null);
  const checkJob = useStudyJob('check', design);
  const ratesJob = useSensitivity(design);
  // The same objects while nothing in them changed, so the contexts' consumers render only when they must.
  const { state: cState, run: cRun, cancel: cCancel, reset: cReset, stale: cStale } = checkJob;
  const check: CheckJob = useMemo(() => ({ state: cState, run: cRun, cancel: cCancel, reset: cReset, stale: cStale }), [cState, cRun, cCancel, cReset, cStale]);
  const { state: rState, run: rRun, cancel: rCancel, stale: rStale } = ratesJob;
  const rates: RatesJob = useMemo(() => ({ state: rState, run: rRun, cancel: rCancel, stale: rStale }), [rState, rRun, rCancel, rStale]);
  // The design each job was last started for by this provider (a user's own run counts too via the job's state).
  const started = useRef<{ check: unknown; rates: unknown }>({ check: null, rates: null });
  // When the design on screen was first seen (for the fallback wait).
  const firstSeen = useRef(0);
  useEffect(() => {
    firstSeen.current = Date.now();
  }, [revision]);

  const [lastCheck, setLastCheck] = useState<FixJobs['lastCheck']>(null);
  if (check.state.phase === 'done' && lastCheck?.data !== check.state.data) setLastCheck({ data: check.state.data, forDesign: check.state.forDesign });
  const checkFor = check.state.phase === 'done' ? check.state.forDesign : null;
  const ratesFor = rates.state.phase === 'done' ? rates.state.forDesign : null;
  const checkRunning = check.state.phase === 'running';
  const ratesRunning = rates.state.phase === 'running';
  const runCheck = check.run;
  const runRates = rates.run;
  const cancelCheck = check.cancel;
  const cancelRates = rates.cancel;
  // An edit makes a running check or rates out of date: stop them, so they do not hold the CPU the plots of the edit need.
  const running = useRef({ check: false, rates: false });
  useEffect(() => {
    running.current = { check: checkRunning, rates: ratesRunning };
  }, [checkRunning, ratesRunning]);
  useEffect(() => {
    if (running.current.check) cancelCheck();
    if (running.current.rates) cancelRates();
  }, [revision, cancelCheck, cancelRates]);

  useEffect(() => {
    if (!auto || !valid || dragging) return;
    // The check first, after the plots; the rates when the check of this design is done.
    if (checkFor !== design && started.current.check !== design && !checkRunning) {
      const go = () => {
        started.current.check = design;
        runCheck({ design });
      };
      if (!plotsBusy) {
        const t = setTimeout(go, 250);
        return () => clearTimeout(t);
      }
      const t = setTimeout(go, Math.max(0, FIX_JOBS_FALLBACK_MS - (Date.now() - firstSeen.current)));
      return () => clearTimeout(t);
    }
    if (checkFor === design && ratesFor !== design && started.current.rates !== design && !ratesRunning && !checkRunning) {
      started.current.rates = design;
      runRates();
    }
    return undefined;
  }, [auto, valid, dragging, plotsBusy, design, checkFor, ratesFor, checkRunning, ratesRunning, runCheck, runRates]);

  const all = useMemo(() => ({ check, rates, lastCheck }), [check, rates, lastCheck]);
  return (
    <FixJobsContext.Provider value={all}>
      <FixRatesContext.Provider value={rates}>
        <LastCheckContext.Provider value={lastCheck}>{children}</LastCheckContext.Provider>
      </FixRatesContext.Provider>
    </FixJobsContext.Provider>
  );
}
