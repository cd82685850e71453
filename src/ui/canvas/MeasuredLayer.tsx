/**
 * The integer-step mode on the mechanism canvas: the measured graph of the
 * sketch's causal-step graph at rate u (measured every u-th step), drawn over
 * the variables where they stand, with the sketch's own links faint beneath.
 * Directed edges (an effect across one measurement) are solid ink lines with
 * a filled head; bidirected edges (a cause shared between two measurements)
 * are dotted in the bidirected colour with a head at both ends; a self-loop
 * (the variable carries over across u steps) is a small arc over the box.
 * The rate u = 1 … U is the Steps tab's own (one store: both show the same u).
 * A click or Enter on an edge says in words why it is there.
 */
import { useMemo, useState, type KeyboardEvent, type ReactElement } from 'react';
import { EdgeLabelRenderer, Panel, useStore, useStoreApi } from '@xyflow/react';
import type { Model } from '../../core/model/types';
import { explainMeasured, has, measuredGraph, MAX_GRAPH_VARIABLES, stepGraphOfModel, type EdgeReason } from '../../core/undersample/index';
import { stepsStore, useSteps } from '../../state/steps';
import { uiStore } from '../../state/ui';
import { INK, MUTED } from '../../theme/visual';
import { BIDIRECTED } from '../../theme/tokens';
import { measuredLabel } from '../../export/undersample';
import { boxOf } from './CanvasDrawing';
import { headPath, linkPath, type Box } from './geometry';
import './measured.css';

const BIDIRECTED_DASH = '2 3.5';

/** The edge's key as the command line names it: "a>b" or "a<>b" (names, a before b in the graph's order). */
const edgeKey = (r: EdgeReason, names: readonly string[]) => (r.kind === 'directed' ? `${names[r.from]}>${names[r.to]}` : `${names[r.a]}<>${names[r.b]}`);

/** A loop over the top edge of a box, ending in a head pointing back down into it. */
function selfLoop(b: Box): { d: string; head: string } {
  const x0 = b.x + b.w * 0.62, x1 = b.x + b.w * 0.84, y = b.y;
  const d = `M${x0},${y} C${x0 - 6},${y - 30} ${x1 + 6},${y - 30} ${x1},${y}`;
  return { d, head: headPath({ x: x1, y }, { x: x1 + 4, y: y - 12 }, 8, 4) };
}

/** The toggle and, when on, the measured graph and its control. Lives inside the flow. */
export function MeasuredLayer({ model }: { model: Model }) {
  const on = useSteps((s) => s.onCanvas);
  if (!on) {
    return (
      <Panel position="bottom-center" className="lf-measured-toggle">
        <button type="button" onClick={() => stepsStore.getState().set({ onCanvas: true })} title="Show the graph an analysis would find if the process moves in whole steps and is measured every u-th step">
          Integer steps: measured graph…
        </button>
      </Panel>
    );
  }
  return <MeasuredOn model={model} />;
}

function MeasuredOn({ model }: { model: Model }) {
  const rate = useSteps((s) => s.rate);
  const maxRate = useSteps((s) => s.maxRate);
  const u = Math.max(1, Math.min(rate, maxRate));
  const step = useMemo(() => stepGraphOfModel(model), [model]);
  const n = step.graph.names.length;
  const usable = n > 0 && n <= MAX_GRAPH_VARIABLES;
  const measured = useMemo(() => (usable ? measuredGraph(step.graph, u) : null), [step, u, usable]);
  const reasons = useMemo(() => (usable ? explainMeasured(step.graph, u) : []), [step, u, usable]);
  const [picked, setPicked] = useState<string | null>(null);
  // redrawn when a node moves or is measured, as the sketch's drawing is
  useStore((s) => s.nodes);
  const lookup = useStoreApi().getState().nodeLookup;
  const names = step.graph.names;
  const set = (next: number) => stepsStore.getState().set({ rate: Math.max(1, Math.min(maxRate, next)) });

  const edges: ReactElement[] = [];
  const bends = new Set<string>();
  if (measured) for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (i !== j && has(measured.directed[i], j)) bends.add(`${i}>${j}`);
  for (const r of reasons) {
    const k = edgeKey(r, names);
    const from = r.kind === 'directed' ? r.from : r.a;
    const to = r.kind === 'directed' ? r.to : r.b;
    const a = boxOf(lookup.get(step.ids[from]));
    const b = boxOf(lookup.get(step.ids[to]));
    if (!a || !b) continue;
    const sel = picked === k;
    const pick = () => setPicked(sel ? null : k);
    const onKey = (e: KeyboardEvent) => { if (e.key === 'Enter' || e.key === ' ') { e.preventDefault(); pick(); } };
    const label = r.text;
    if (r.kind === 'directed' && from === to) {
      const s = selfLoop(a);
      edges.push(
        <g key={k} className={`lf-measured-edge${sel ? ' is-picked' : ''}`} data-edge={k} data-kind="self" tabIndex={0} role="button" aria-pressed={sel} aria-label={label} onClick={pick} onKeyDown={onKey}>
          <title>{label}</title>
          <path d={s.d} className="lf-measured-hit" fill="none" strokeWidth={12} />
          <path d={s.d} fill="none" stroke={INK} strokeWidth={sel ? 2.6 : 1.4} />
          <path d={s.head} fill={INK} stroke={INK} strokeWidth={1} strokeLinejoin="round" />
        </g>,
      );
    } else if (r.kind === 'directed') {
      // a pair joined both ways bows apart; a single edge runs almost straight
      const g = linkPath(a, b, bends.has(`${to}>${from}`) ? 0.16 : 0.06);
      edges.push(
        <g key={k} className={`lf-measured-edge${sel ? ' is-picked' : ''}`} data-edge={k} data-kind="directed" tabIndex={0} role="button" aria-pressed={sel} aria-label={label} onClick={pick} onKeyDown={onKey}>
          <title>{label}</title>
          <path d={g.path} className="lf-measured-hit" fill="none" strokeWidth={16} />
          <path d={g.path} fill="none" stroke={INK} strokeWidth={sel ? 3.4 : 2} />
          <path d={headPath(g.tip, g.control, 10, 5)} fill={INK} stroke={INK} strokeWidth={1} strokeLinejoin="round" />
        </g>,
      );
    } else {
      // bidirected: bowed to the other side, dotted, heads at both ends
      const g = linkPath(a, b, -0.22);
      const back = linkPath(b, a, 0.22);
      edges.push(
        <g key={k} className={`lf-measured-edge${sel ? ' is-picked' : ''}`} data-edge={k} data-kind="bidirected" tabIndex={0} role="button" aria-pressed={sel} aria-label={label} onClick={pick} onKeyDown={onKey}>
          <title>{label}</title>
          <path d={g.path} className="lf-measured-hit" fill="none" strokeWidth={16} />
          <path d={g.path} fill="none" stroke={BIDIRECTED} strokeWidth={sel ? 3.4 : 2.2} strokeDasharray={BIDIRECTED_DASH} strokeLinecap="round" />
          <path d={headPath(g.tip, g.control, 9, 4.5)} fill={BIDIRECTED} stroke={BIDIRECTED} strokeWidth={1} strokeLinejoin="round" />
          <path d={headPath(back.tip, back.control, 9, 4.5)} fill={BIDIRECTED} stroke={BIDIRECTED} strokeWidth={1} strokeLinejoin="round" />
        </g>,
      );
    }
  }
  const directed = reasons.filter((r) => r.kind === 'directed' && r.from !== r.to).length;
  const loops = reasons.filter((r) => r.kind === 'directed' && r.from === r.to).length;
  const bidirected = reasons.filter((r) => r.kind === 'bidirected').length;
  const pickedReason = reasons.find((r) => edgeKey(r, names) === picked);
  const left = model.variables.filter((v) => !step.ids.includes(v.id));
  return (
    <>
      <EdgeLabelRenderer>
        <svg className="lf-links lf-measured" aria-label={`Measured graph, every ${u === 1 ? 'step' : `${u}th step`}`} role="group" data-rate={u}>
          {edges}
        </svg>
      </EdgeLabelRenderer>
      <Panel position="bottom-center" className="lf-measured-panel" aria-label="Measured graph control">
        <div className="lf-measured-head">
          <strong>Integer steps · {measuredLabel(u)}</strong>
          <button type="button" className="lf-measured-close" aria-label="Back to the sketch's links" onClick={() => stepsStore.getState().set({ onCanvas: false })}>× Sketch</button>
        </div>
        {!usable ? (
          <p className="lf-measured-note" role="status">{n === 0 ? 'The sketch has no state yet: the measured graph is read from its states and integrating links.' : `The sketch has ${n} states and inputs that act on them; the integer-step mode takes at most ${MAX_GRAPH_VARIABLES}.`}</p>
        ) : (
          <>
            <div className="lf-measured-rate">
              <button type="button" aria-label="Measure more often (u − 1)" disabled={u <= 1} onClick={() => set(u - 1)}>−</button>
              <input type="range" min={1} max={maxRate} step={1} value={u} aria-label="Measured every u-th step (canvas)" aria-valuetext={`u = ${u}`} onChange={(e) => set(Number(e.target.value))} />
              <button type="button" aria-label="Measure less often (u + 1)" disabled={u >= maxRate} onClick={() => set(u + 1)}>+</button>
            </div>
            <div className="lf-measured-ticks" aria-hidden="true">
              {Array.from({ length: maxRate }, (_, k) => k + 1).map((x) => (
                <button key={x} type="button" tabIndex={-1} aria-pressed={x === u} onClick={() => set(x)}>{x}</button>
              ))}
            </div>
            <p className="lf-measured-note" data-testid="measured-summary" data-directed={directed + loops} data-bidirected={bidirected}>
              <svg width="34" height="10" aria-hidden="true"><line x1="1" y1="5" x2="25" y2="5" stroke={INK} strokeWidth="2" /><path d="M24,1 L33,5 L24,9 Z" fill={INK} /></svg> {directed} across {u === 1 ? 'one step' : `${u} steps`}{loops > 0 ? ` (and ${loops} carry-over${loops === 1 ? '' : 's'})` : ''}
              {' · '}
              <svg width="38" height="10" aria-hidden="true"><path d="M1,5 L9,1 L9,9 Z" fill={BIDIRECTED} /><line x1="9" y1="5" x2="29" y2="5" stroke={BIDIRECTED} strokeWidth="2" strokeDasharray={BIDIRECTED_DASH} /><path d="M29,1 L37,5 L29,9 Z" fill={BIDIRECTED} /></svg> {bidirected} shared cause{bidirected === 1 ? '' : 's'} between measurements
            </p>
            <p className="lf-measured-why" role="status" data-testid="measured-why">
              {pickedReason ? pickedReason.text : 'Pick an edge (click, or Tab and Enter) to see why it is there.'}
            </p>
            <p className="lf-measured-note">
              <button type="button" className="lf-measured-close" onClick={() => uiStore.getState().set({ pane: 'steps' })}>Which causal graphs give this? (Steps tab)</button>
            </p>
            {left.length > 0 && <p className="lf-measured-note lf-measured-left" style={{ color: MUTED }}>Not in the step graph: {left.map((v) => v.label ?? v.id).join(', ')} (passed on within the step, or acting on no state).</p>}
          </>
        )}
      </Panel>
    </>
  );
}
