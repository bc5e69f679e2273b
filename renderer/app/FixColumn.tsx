/**
 * The column beside the vehicle: what is wrong, and how to fix it. First the findings (this
 * pose's alerts, then the operating region's items, worst first; each opens into its fix), then,
 * one tab away, the full hardpoint table, the studies and the design's settings. The tabs stay
 * mounted, so a running study and a half-typed value survive a change of tab.
 */
import type { ReactNode } from 'react';
import { DesignSheet } from '../panels/DesignSheet';
import { HardpointTable } from '../panels/HardpointTable';
import { LimitsPanel } from '../panels/LimitsPanel';
import { AlertsPanel } from '../panels/ReadoutPanel';
import { SelectedPoint } from '../panels/SelectedPoint';
import { OrphanFix } from '../panels/FixPanel';
import type { FixColumnTab } from '../state/uiStore';
import { StudiesPanel } from '../studies/StudiesPanel';
import { usePose, useUi, useWorkbenchApi } from './workbenchContext';
import { useLastCheck } from './fixJobs';

const TABS: { id: FixColumnTab; label: string; title: string }[] = [
  { id: 'findings', label: "What's wrong", title: 'This pose and the operating region: what is over or close to a limit, worst first; click one to see where it is and how to fix it' },
  { id: 'hardpoints', label: 'All hardpoints', title: 'Every hardpoint, its coordinates, mirroring, rates per mm and proposals' },
  { id: 'studies', label: 'Studies', title: 'Tune, proposals, tolerance spread, fit to a built vehicle, compare with a reference' },
  { id: 'settings', label: 'Settings', title: 'The design sheet: vehicle, wheels, steering, joints, tolerances, operating region' },
];

function Tab({ id, children }: { id: FixColumnTab; children: ReactNode }) {
  const shown = useUi((s) => s.fixColumn === id);
  return (
    <div className="column-page" role="tabpanel" hidden={!shown} id={`column-${id}`} data-testid={`column-${id}`}>
      {children}
    </div>
  );
}

/** How many findings there are now (this pose's alerts and the last check's items over or close), for the tab's label. */
function useFindingCount(): number {
  const alerts = usePose((s) => s.outcome.alerts.length + s.issues.length);
  const region = useLastCheck()?.data.items.filter((i) => i.verdict !== 'within').length ?? 0;
  return alerts + region;
}

// The tabs' contents as elements made once: when the column renders again (its count or tab
// changed) React skips every tab whose element is the same, so the hidden tabs (the hardpoint
// table's hundreds of inputs, the studies' forms) are not rendered again for nothing.
const FINDINGS = (
  <>
    <SelectedPoint />
    <OrphanFix />
    <AlertsPanel />
    <LimitsPanel />
  </>
);
const HARDPOINTS = <HardpointTable />;
const STUDIES = <StudiesPanel />;
const SETTINGS = <DesignSheet />;

export function FixColumn() {
  const { ui } = useWorkbenchApi();
  const tab = useUi((s) => s.fixColumn);
  const count = useFindingCount();
  return (
    <aside className="side right-side fix-column" aria-label="What's wrong and how to fix it">
      <div className="column-tabs" role="tablist" aria-label="What's wrong, hardpoints, studies, settings">
        {TABS.map((t) => (
          <button key={t.id} type="button" role="tab" aria-selected={tab === t.id} aria-controls={`column-${t.id}`} title={t.title} onClick={() => ui.setState({ fixColumn: t.id })} data-testid={`column-tab-${t.id}`}>
            {t.label}
            {t.id === 'findings' && count > 0 && (
              <span className="tab-count" data-testid="findings-count" aria-label={`${count} findings`}>
                {count}
              </span>
            )}
          </button>
        ))}
      </div>
      <Tab id="findings">{FINDINGS}</Tab>
      <Tab id="hardpoints">{HARDPOINTS}</Tab>
      <Tab id="studies">{STUDIES}</Tab>
      <Tab id="settings">{SETTINGS}</Tab>
    </aside>
  );
}
