import { describe, expect, it } from 'vitest';
import type { Model, Study } from '../../../src/core/model/types';
import { studyDesign } from '../../../src/core/study/report';
import { expectClose } from '../../helpers/tolerance';

// A pond's temperature (one state, timescale 6 h, in hours): a model of our own.
const pond = (reliability?: number): Model => ({
  format: 'loopfold-model', version: 2, name: 'pond', timeUnit: 'h',
  variables: [
    { id: 'sun', kind: 'input', value: 1 },
    { id: 'temp', kind: 'state', label: 'Water temperature', timescale: 6, noise: 2, ...(reliability === undefined ? {} : { reliability }) },
  ],
  links: [{ from: 'sun', to: 'temp', kind: 'integrating', sign: '+' }],
});
const study: Study = { interval: '3 h', length: '14 days', schedule: { kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing: 'fixed' } };

describe('what a VAR estimates when the measurement has a reliability below 1', () => {
  it('one state: the estimated autoregression is the reliability times the true one (attenuation by the reliability ratio; measurement-error models, common practice)', () => {
    const exact = studyDesign(pond(), study);
    const measured = studyDesign(pond(0.6), study);
    if (!exact.ok || !measured.ok) throw new Error('design');
    expect(exact.report.pooledMeasured).toBeNull();
    // Φ over 3 h of a state with timescale 6 h is e^(−3/6) (exponential decay; common practice)
    expectClose(exact.report.nominal[0][0], Math.exp(-0.5), { relTol: 1e-9 });
    expectClose(measured.report.pooledMeasured![0][0], 0.6 * measured.report.pooled[0][0], { relTol: 1e-9 });
    // the reliability changes what is measured, not the process
    expectClose(measured.report.pooled[0][0], exact.report.pooled[0][0], { relTol: 1e-12 });
  });
});
