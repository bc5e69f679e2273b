/**
 * The design studies beside the hardpoint table: tune, proposals, tolerance spread, the fit to
 * a built vehicle's measurements and the comparison with a reference design. Each runs in the sweep worker with progress and cancel.
 */
import { useState } from 'react';
import { ComparePanel } from './ComparePanel';
import { FitPanel } from './FitPanel';
import { ProposalsPanel } from './ProposalsPanel';
import { SpreadPanel } from './SpreadPanel';
import { TunePanel } from './TunePanel';

const TABS = [
  { id: 'tune', label: 'Tune', title: 'Move the points you tick to bring the measures you choose inside their tolerances' },
  { id: 'proposals', label: 'Proposals', title: 'Classic constructions applied to this design, with their effect' },
  { id: 'spread', label: 'Spread', title: 'What manufacturing tolerances do to the measures' },
  { id: 'fit', label: 'Fit', title: 'Where the points of a built vehicle really are, from measurements taken on it' },
  { id: 'compare', label: 'Compare', title: 'This design against a reference' },
] as const;

type TabId = (typeof TABS)[number]['id'];

export function StudiesPanel() {
  const [tab, setTab] = useState<TabId>('tune');
  return (
    <section className="panel studies-panel" aria-labelledby="studies-title" data-testid="studies-panel">
      <h2 id="studies-title">Studies</h2>
      <div className="study-tabs" role="tablist" aria-label="Studies">
        {TABS.map((t) => (
          <button key={t.id} type="button" role="tab" aria-selected={tab === t.id} title={t.title} onClick={() => setTab(t.id)} data-testid={`study-tab-${t.id}`}>
            {t.label}
          </button>
        ))}
      </div>
      {/* Panels stay mounted so a running study and its result survive a change of tab. */}
      <div hidden={tab !== 'tune'}>
        <TunePanel />
      </div>
      <div hidden={tab !== 'proposals'}>
        <ProposalsPanel />
      </div>
      <div hidden={tab !== 'spread'}>
        <SpreadPanel />
      </div>
      <div hidden={tab !== 'fit'}>
        <FitPanel />
      </div>
      <div hidden={tab !== 'compare'}>
        <ComparePanel />
      </div>
    </section>
  );
}
