import type { Model, VariableId } from '../../core/model/types';
import { circleLayout, strongEdges } from './chart';
import { nameOf, weightText } from './format';

const W = 410, H = 250, NW = 108, NH = 22;

/**
 * A small node-link drawing of a network: line width ∝ |weight|, solid for
 * positive and dashed for negative weights, each labelled with its value.
 * Directed networks get arrowheads and show the self-effect under the node.
 */
export function NetworkDiagram({ model, states, matrix, directed, title, onPick }: { model: Model; states: VariableId[]; matrix: number[][]; directed: boolean; title: string; onPick?: (from: VariableId, to: VariableId) => void }) {
  const pos = circleLayout(states.length, W, H, 36).map((p) => ({ x: p.x, y: p.y }));
  const edges = strongEdges(matrix, 0.02, !directed);
  const max = Math.max(1e-300, ...edges.map((e) => Math.abs(e.weight)));
  const id = `lf-arrow-${directed ? 'd' : 'u'}-${title.replace(/\W+/g, '')}`;
  return (
    <svg className="lf-num-network" viewBox={`0 0 ${W} ${H}`} role="img" aria-label={title}>
      <defs>
        <marker id={id} viewBox="0 0 10 10" refX="9" refY="5" markerWidth="9" markerHeight="9" markerUnits="userSpaceOnUse" orient="auto-start-reverse">
          <path d="M0,0 L10,5 L0,10 z" className="lf-net-arrow" />
        </marker>
      </defs>
      {edges.map((e) => {
        const a = pos[e.from], b = pos[e.to];
        // Two opposite links between the same pair bend apart.
        const both = directed && edges.some((f) => f.from === e.to && f.to === e.from);
        const dx = b.x - a.x, dy = b.y - a.y, len = Math.hypot(dx, dy) || 1;
        const ux = dx / len, uy = dy / len;
        // Start and end where the line leaves the node's box (plus a small gap).
        const cut = Math.min(Math.abs(ux) > 1e-9 ? NW / 2 / Math.abs(ux) : Infinity, Math.abs(uy) > 1e-9 ? NH / 2 / Math.abs(uy) : Infinity) + 3;
        const sx = a.x + ux * cut, sy = a.y + uy * cut, ex = b.x - ux * cut, ey = b.y - uy * cut;
        const bend = both ? 14 : 0;
        const mx = (sx + ex) / 2 - uy * bend, my = (sy + ey) / 2 + ux * bend;
        // The weight sits 40% of the way from the source, so labels of crossing lines do not meet in the middle.
        const lx = 0.36 * sx + 0.48 * mx + 0.16 * ex, ly = 0.36 * sy + 0.48 * my + 0.16 * ey;
        return (
          <g
            key={`${e.from}-${e.to}`}
            data-edge={`${states[e.from]}>${states[e.to]}`}
            {...(onPick
              ? {
                  role: 'button',
                  tabIndex: 0,
                  className: 'lf-net-pick',
                  'aria-label': `Show ${nameOf(model, states[e.from])} → ${nameOf(model, states[e.to])} against the interval`,
                  onClick: () => onPick(states[e.from], states[e.to]),
                  onKeyDown: (ev: React.KeyboardEvent) => { if (ev.key === 'Enter' || ev.key === ' ') { ev.preventDefault(); onPick(states[e.from], states[e.to]); } },
                }
              : {})}
          >
            {onPick && <path d={`M${sx},${sy} Q${mx},${my} ${ex},${ey}`} className="lf-net-hit" />}
            <path
              d={`M${sx},${sy} Q${mx},${my} ${ex},${ey}`}
              className="lf-net-edge"
              strokeWidth={0.8 + 4 * (Math.abs(e.weight) / max)}
              strokeDasharray={e.weight < 0 ? '5 3' : undefined}
              markerEnd={directed ? `url(#${id})` : undefined}
            />
            <text x={lx} y={ly + 3} textAnchor="middle" className="lf-net-weight">{weightText(e.weight)}</text>
          </g>
        );
      })}
      {states.map((s, i) => (
        <g key={s} transform={`translate(${pos[i].x}, ${pos[i].y})`}>
          <rect x={-NW / 2} y={-NH / 2} width={NW} height={NH} rx={4} className="lf-net-node" />
          <text y={4} textAnchor="middle" className="lf-net-name">{shorten(nameOf(model, s))}</text>
          {/* The self-effect beside the node, on the side away from the middle (where the links run). */}
          {directed && (
            <text x={pos[i].x >= W / 2 - 1 ? NW / 2 + 4 : -NW / 2 - 4} y={4} textAnchor={pos[i].x >= W / 2 - 1 ? 'start' : 'end'} className="lf-net-self">
              self {weightText(matrix[i][i])}
            </text>
          )}
        </g>
      ))}
    </svg>
  );
}

function shorten(s: string): string {
  return s.length > 17 ? `${s.slice(0, 16)}…` : s;
}
