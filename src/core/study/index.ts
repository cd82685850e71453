/**
 * The study a modeller plans, in one place: conversions (`convert.ts`), the
 * study a model carries or starts with (`design.ts`), prompt times and missed
 * prompts (`schedule.ts`, seeded by `../stats/random.ts`), the gaps between prompts and
 * what a VAR over them estimates (`gaps.ts`), and the design report (`report.ts`).
 */
export {
  DEFAULT_NOISE, DEFAULT_PERSONS, DEFAULT_RELIABILITY,
  convertStudy, designAxis, designOfStudy, exactDuration, intervalLabel, lengthAxis, modelAxis, noiseOf, parseInterval, reliabilityOf, studyInterval, windowOf,
} from './convert';
export type { StudyAxis } from './convert';
export { defaultInterval, studyOfModel, studyRange } from './design';
export { seededRandom } from '../stats/random';
export type { Random } from '../stats/random';
export { DEFAULT_SEED, MAX_PROMPTS, answeredOccasions, clockMinutes, nominalSpacing, plannedSlots, promptPlan, studyPrompts } from './schedule';
export type { PersonPrompts, PlannedSlots, PromptPlan } from './schedule';
export { attenuated, phiOverGap, scheduleGaps, varLimits } from './gaps';
export type { GapClass, GapPhi, VarLimits } from './gaps';
export { studyDesign } from './report';
export type { DesignGap, StudyDesignReport } from './report';
