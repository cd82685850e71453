/** The caption the app and the command line put under a figure at a sampling interval. */
import type { Model } from '../core/model/types';
import { formatDuration } from '../core/model/units';
import { studyText } from '../core/view/derive';
import type { ViewModel } from '../core/view/types';
import { designAxis, windowOf } from '../core/study/convert';

export interface StudyAt {
  interval?: number;
  /** Study length as a duration (wins over `samples`). */
  window?: number;
  /** Study length in samples (default: the model's settings, else 50). */
  samples?: number;
}

/** "Sampling interval every 1 h · study 50 samples (2.08 days)"; undefined without an interval. */
export function studyCaption(model: Model, study: StudyAt): string | undefined {
  if (study.interval === undefined) return undefined;
  return `Sampling interval every ${formatDuration(study.interval, model.timeUnit)} · ${studyText(model, study.interval, study.window, study.samples)}`;
}

/** The study length in model time: the window, or samples × interval. */
export function studyLength(model: Model, study: StudyAt): number | undefined {
  if (study.interval === undefined) return undefined;
  return windowOf(designAxis(model, study), study.interval);
}

/**
 * The caption of an ordering or three-instant figure: what the figure shows that its title does not —
 * which variables are settled, frozen or held, which are determined together, and how many links act
 * within the instant and across time. Example: "Settled (fast, at balance): Stress. Frozen (slow,
 * constant over the study): Coping skill. 4 links within the instant, 3 lagged."
 */
export function viewCaption(vm: ViewModel): string {
  const names = (role: string) => [...new Set(vm.nodes.filter((n) => n.role === role && n.variable !== undefined).map((n) => n.label))];
  const parts: string[] = [];
  const roles: [string, string][] = [['settled', 'Settled (fast, at balance)'], ['frozen', 'Frozen (slow, constant over the study)'], ['held', 'Held (fixed by an intervention)']];
  for (const [role, words] of roles) {
    const ns = names(role);
    if (ns.length) parts.push(`${words}: ${ns.join(', ')}.`);
  }
  const blocks = new Set([...vm.groups.map((g) => g.key), ...vm.folded]);
  if (blocks.size) parts.push(`${blocks.size === 1 ? 'One block' : `${blocks.size} blocks`} of variables determined together${vm.folded.length ? ` (${vm.folded.length} folded)` : ''}.`);
  const pairs = (kind: string) => new Set(vm.edges.filter((e) => e.kind === kind).flatMap((e) => e.pairs.map((p) => `${p.from}>${p.to}`))).size;
  const within = pairs('instantaneous'), lagged = pairs('integrating');
  parts.push(`${within} link${within === 1 ? '' : 's'} within the instant, ${lagged} lagged${vm.mode === 'unrolled' ? ' (drawn between instants)' : ''}.`);
  if (parts.length === 1 && !names('state').length) parts.unshift('Every variable follows its causes within the instant.');
  return parts.join(' ');
}
