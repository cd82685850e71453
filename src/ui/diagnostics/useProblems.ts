import { useMemo } from 'react';
import { useModel, useValidation } from '../../state/document';
import { useAnalysisState } from '../../state/analysis';
import { collectProblems, type Problem } from './collect';

/** The problems of the current document; core diagnostics only while they belong to this model or its last valid state. */
export function useProblems(): Problem[] {
  const model = useModel();
  const validation = useValidation();
  const diagnostics = useAnalysisState((s) => s.analysis?.ordering.diagnostics);
  return useMemo(() => collectProblems(model, validation, diagnostics), [model, validation, diagnostics]);
}
