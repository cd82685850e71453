import { useAnalysisState } from '../state/analysis';
import { useUi } from '../state/ui';
import { KeysHelp } from './KeysHelp';

/** The bottom line: the standing note on what results are, and where the core runs. */
export function StatusBar() {
  const where = useAnalysisState((s) => s.where);
  const autosaved = useUi((s) => s.autosaved);
  return (
    <footer className="lf-status">
      <span className="lf-hypotheses">Results are model-based hypotheses: they follow from the model as drawn, not from observations.</span>
      <KeysHelp />
      <span className="lf-hint lf-status-right">{[autosaved ? `kept in this browser at ${autosaved}` : '', where ? `core: ${where}` : ''].filter(Boolean).join(' · ')}</span>
    </footer>
  );
}
