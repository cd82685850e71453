/**
 * A short notice wherever settling or a rest point is shown: while the model
 * has a growing mode (the `growing-mode` check), states move away from their
 * balance, so "settles" and "comes to rest" do not hold.
 */
import { useModel } from '../../state/document';
import { useAnalysisState } from '../../state/analysis';
import { labelOf } from '../../present/index';

export function useGrowingStates(): string[] | null {
  const diagnostics = useAnalysisState((s) => s.analysis?.ordering.diagnostics);
  const model = useModel();
  const growing = (diagnostics ?? []).filter((d) => d.code === 'growing-mode');
  if (growing.length === 0) return null;
  const ids = [...new Set(growing.flatMap((d) => d.variables))];
  return ids.map((id) => labelOf(model, id));
}

function names(list: string[]): string {
  return list.length <= 1 ? list.join('') : `${list.slice(0, -1).join(', ')} and ${list[list.length - 1]}`;
}

/** `what`: what is not valid here, e.g. "the settling shown at this interval". */
export function GrowthNotice({ what }: { what: string }) {
  const states = useGrowingStates();
  if (!states) return null;
  return (
    <p className="lf-growth-notice" role="note" data-growing={states.length}>
      <strong>Not at rest:</strong> the model has a growing mode carried by {names(states)} (see Checks). While it grows these states move away from their balance, so {what} is not valid.
    </p>
  );
}
