import { ReactFlowProvider } from '@xyflow/react';
import '@xyflow/react/dist/base.css';
import './styles.css';
import { TopBar } from './TopBar';
import { ModelCanvas } from './canvas/ModelCanvas';
import { RightPane } from './RightPane';
import { StatusBar } from './StatusBar';
import { GalleryDialog } from './GalleryDialog';
import { NoticeDialog } from './NoticeDialog';
import { CautionBanner } from './CautionBanner';
import { Toast } from './Toast';
import { IntervalStrip } from './interval/IntervalStrip';
import { useShortcuts } from './useShortcuts';
import { useEffect } from 'react';
import { useUi } from '../state/ui';
import { startSession } from '../state/session';
import { isIntervalDragging, onIntervalDrag } from './interval/dragging';
import { Presentation } from './Presentation';

function Shell() {
  useShortcuts();
  // The analysis follows the session's study (interval, length, holds), whichever pane is open.
  useEffect(() => startSession({ active: isIntervalDragging, subscribe: onIntervalDrag }), []);
  const wide = useUi((s) => s.pane !== 'edit');
  return (
    <div className="lf-app">
      <TopBar />
      <CautionBanner />
      <main className={`lf-main${wide ? ' is-wide' : ''}`}>
        <div className="lf-left">
          <ModelCanvas />
          <div id="interval-strip">
            <IntervalStrip />
          </div>
        </div>
        <RightPane />
      </main>
      <StatusBar />
      <GalleryDialog />
      <NoticeDialog />
      <Toast />
      <Presentation />
    </div>
  );
}

/** The Loopfold editor. */
export function App() {
  return (
    <ReactFlowProvider>
      <Shell />
    </ReactFlowProvider>
  );
}
