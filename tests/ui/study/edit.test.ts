import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import type { Study } from '../../../src/core/model/types';
import { clockText, lengthAs, missedShare, patchProblem, schedulePatch, wholeNumber } from '../../../src/ui/study/edit';
import { EXAMPLES } from '../../../src/examples/index';

const r = parseModel(EXAMPLES.find((e) => e.id === 'sleep-stress')!.model);
if (!r.ok) throw new Error('example');
const model = r.model;
const study = model.study!;

describe('the Study tab’s fields', () => {
  it('a new window gives the interval its prompts are apart', () => {
    // stratified random: the window split in equal parts, 12 h / 4 = 3 h; evenly spaced: 12 h / (4 − 1) = 4 h (common practice)
    expect(schedulePatch({ kind: 'daily-window', promptsPerDay: 4, from: '09:00', to: '21:00', timing: 'stratified-random' }, 'h').interval).toBe('3 h');
    expect(schedulePatch({ kind: 'daily-window', promptsPerDay: 4, from: '09:00', to: '21:00', timing: 'fixed' }, 'h').interval).toBe('4 h');
    expect(schedulePatch({ kind: 'weekly' }, 'h').interval).toBe('1 week');
    expect(schedulePatch({ kind: 'fixed' }, 'h')).toEqual({ schedule: { kind: 'fixed' } });
  });
  it('a problem names its field and the study is not stored', () => {
    expect(patchProblem(study, { persons: 0 }, model)).toBe('Persons: must be at least 1');
    expect(patchProblem(study, schedulePatch({ ...(study.schedule as Extract<Study['schedule'], { kind: 'daily-window' }>), to: '08:00' }, 'h'), model)).toMatch(/^Last prompt by: must be later in the day than "from"/);
    expect(patchProblem(study, { length: 'a fortnight or so' }, model)).toMatch(/^Study length: /);
    expect(patchProblem(study, { persons: 12 }, model)).toBeNull();
    expect(wholeNumber('2.5', 'Prompts per day', 1)).toEqual({ ok: false, message: 'Prompts per day: must be a whole number, not 2.5' });
    expect(missedShare('120')).toEqual({ ok: false, message: 'Missed prompts: must be a percentage from 0 up to (not including) 100' });
    expect(missedShare('20 %')).toEqual({ ok: true, value: 0.2 });
    expect(clockText('9')).toBe('09:00');
  });
  it('the length given the other way keeps the study: 14 days of 5 prompts are 70 prompts, and back', () => {
    expect(lengthAs(study, 'h', 'samples')).toBe(70);
    expect(lengthAs({ ...study, length: 70 }, 'h', 'duration')).toBe('14 day');
    expect(lengthAs({ interval: '3 h', length: 8, schedule: { kind: 'fixed' } }, 'h', 'duration')).toBe('1 day');
  });
});
