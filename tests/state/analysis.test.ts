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

  it('does not analyse the equations again when a drag only moves a variable', async () => {
    let calls = 0;
    const spy: CoreApi = {
      analyze: async (model, design) => {
        calls++;
        return localCore.analyze(model, design);
      },
    };
    documentStore.getState().load({ ...emptyModel(), variables: [{ id: 'load', kind: 'input', value: 1, position: { x: 0, y: 0 } }, { id: 'level', kind: 'state', timescale: 2, position: { x: 200, y: 0 } }], links: [{ from: 'load', to: 'level', kind: 'integrating' }] });
    const stop = startAnalysis(createCoreClient(null, () => spy), 5);
    try {
      await until(() => calls === 1 && analysisStore.getState().status === 'done' && analysisStore.getState().model === selectModel(documentStore.getState()));
      const analysis = analysisStore.getState().analysis;
      // the end of a drag: one move of the document
      documentStore.getState().apply({ type: 'move', positions: { level: { x: 260, y: 40 } } }, { squash: 'move:level' });
      await new Promise((r) => setTimeout(r, 60));
      expect(calls).toBe(1);
      expect(analysisStore.getState().analysis).toBe(analysis);
      // the analysis now belongs to the moved model
      expect(analysisStore.getState().model).toBe(selectModel(documentStore.getState()));
      expect(documentStore.getState().history.past).toHaveLength(1);
      // undoing the move is a move too; an edit of the equations is analysed again
      documentStore.getState().undo();
      await new Promise((r) => setTimeout(r, 60));
      expect(calls).toBe(1);
      documentStore.getState().apply({ type: 'updateVariable', id: 'level', patch: { timescale: 500 } });
      await until(() => calls === 2 && analysisStore.getState().status === 'done');
      expect(analysisStore.getState().analysis).not.toBe(analysis);
    } finally {
      stop();
    }
  });
});
