import { describe, expect, it } from 'vitest';
import { analysisStore, setStudyDesign, startAnalysis } from '../../src/state/analysis';
import { documentStore, selectModel } from '../../src/state/document';
import { emptyModel } from '../../src/state/changes';
import { createCoreClient } from '../../src/worker/client';
import { localCore } from '../../src/worker/analyze';
import type { CoreApi } from '../../src/worker/protocol';

const until = async (cond: () => boolean, ms = 5000) => {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > ms) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 10));
  }
};

// Common practice for editors with a background analysis: results are view state, never undo steps.
describe('analysis of the document', () => {
  it('follows edits and the study design, and never writes into the undo history', async () => {
    const seen: unknown[] = [];
    const spy: CoreApi = {
      analyze: async (model, design) => {
        seen.push(design);
        return localCore.analyze(model, design);
      },
    };
    documentStore.getState().load({ ...emptyModel(), variables: [{ id: 'load', kind: 'input', value: 1 }, { id: 'level', kind: 'state', timescale: 2 }], links: [{ from: 'load', to: 'level', kind: 'integrating' }] });
    const stop = startAnalysis(createCoreClient(null, () => spy), 5);
    try {
      await until(() => analysisStore.getState().status === 'done');
      const history = documentStore.getState().history;
      expect(history.past).toHaveLength(0);
      expect(analysisStore.getState().analysis!.ordering.roles.level).toBe('state');
      expect(analysisStore.getState().where).toBe('main thread');

      // a long interval settles the state (2 h ≪ 100 h): the design reaches the core
      setStudyDesign({ interval: 100, samples: 50 });
      await until(() => analysisStore.getState().analysis?.ordering.roles.level === 'settled');
      expect(seen.at(-1)).toEqual({ interval: 100, samples: 50 });
      expect(documentStore.getState().history).toBe(history);

      documentStore.getState().apply({ type: 'addVariable', variable: { id: 'extra', kind: 'derived' } });
      await until(() => analysisStore.getState().model === selectModel(documentStore.getState()) && analysisStore.getState().status === 'done');
      expect(documentStore.getState().history.past).toHaveLength(1);
    } finally {
      stop();
      setStudyDesign({});
    }
  });
});
