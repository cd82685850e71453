import { useUi, uiStore, type RightPane as Pane } from '../state/ui';
import { TimescalePane } from './views/TimescalePane';
import { Inspector } from './inspector/Inspector';
import { DiagnosticsList } from './diagnostics/DiagnosticsList';
import { EquationsView } from './equations/EquationsView';
import { CommutationPanel, HoldControl } from './interventions';
import { lazy, Suspense } from 'react';
import { PaneTabs } from './PaneTabs';

// The Numbers pane and its worker load only when the tab is first opened.
const NumbersPane = lazy(() => import('./numbers/NumbersPane'));
const PicturesPane = lazy(() => import('./pictures/PicturesPane'));
const StepsPane = lazy(() => import('./undersample/StepsPane'));
const StudyPane = lazy(() => import('./study/StudyPane'));
const DataPane = lazy(() => import('./data/DataPane'));
const RehearsePane = lazy(() => import('./rehearse/RehearsePane'));

const TABS: { id: Pane; name: string }[] = [
  { id: 'edit', name: 'Edit' },
  { id: 'equations', name: 'Equations' },
  { id: 'timescales', name: 'Timescales' },
  { id: 'intervene', name: 'Intervene' },
  { id: 'numbers', name: 'Numbers' },
  { id: 'pictures', name: 'Pictures' },
  { id: 'steps', name: 'Steps' },
  { id: 'study', name: 'Study' },
  { id: 'data', name: 'Data' },
  { id: 'rehearse', name: 'Rehearse' },
];

/** The pane beside the canvas: editing and checks, the equation structure, the timescale views, or interventions. */
export function RightPane() {
  const pane = useUi((s) => s.pane);
  return (
    <aside className="lf-right" aria-label="Side pane">
      <PaneTabs tabs={TABS} pane={pane} choose={(id) => uiStore.getState().set({ pane: id })} />
      <div role="tabpanel" id={`lf-panel-${pane}`} aria-labelledby={`lf-tab-${pane}`} className="lf-panel">
        {pane === 'edit' && (
          <>
            <Inspector />
            <DiagnosticsList />
          </>
        )}
        {pane === 'equations' && <EquationsView />}
        {pane === 'timescales' && <TimescalePane />}
        {pane === 'intervene' && (
          <div className="lf-intervene">
            <HoldControl />
            <CommutationPanel />
          </div>
        )}
        {pane === 'numbers' && (
          <Suspense fallback={<p className="lf-num-wait">Loading the numbers…</p>}>
            <NumbersPane />
          </Suspense>
        )}
        {pane === 'pictures' && (
          <Suspense fallback={<p className="lf-pic-note">Loading the pictures…</p>}>
            <PicturesPane />
          </Suspense>
        )}
        {pane === 'steps' && <Suspense fallback={<p className="lf-num-wait">Loading…</p>}><StepsPane /></Suspense>}
        {pane === 'study' && <Suspense fallback={<p className="lf-num-wait">Loading…</p>}><StudyPane /></Suspense>}
        {pane === 'data' && <Suspense fallback={<p className="lf-num-wait">Loading…</p>}><DataPane /></Suspense>}
        {pane === 'rehearse' && <Suspense fallback={<p className="lf-num-wait">Loading…</p>}><RehearsePane /></Suspense>}
      </div>
    </aside>
  );
}
