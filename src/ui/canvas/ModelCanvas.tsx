import { useCallback, useEffect, useMemo, useRef, useState, type CSSProperties, type DragEvent, type MouseEvent as ReactMouseEvent } from 'react';
import {
  Background,
  BackgroundVariant,
  ConnectionMode,
  ControlButton,
  Controls,
  MiniMap,
  ReactFlow,
  applyNodeChanges,
  useReactFlow,
  useStore,
  useNodesInitialized,
  useStoreApi,
  type FitViewOptions,
  type FinalConnectionState,
  type NodeChange,
} from '@xyflow/react';
import { documentStore, editDocument, useDocument, useModel } from '../../state/document';
import { selectionStore, useSelection } from '../../state/selection';
import { useUi } from '../../state/ui';
import { ROLE_STYLE } from '../../theme/visual';
import { addLink, addVariable, openFile, setViewCentreProvider } from '../actions';
import { badgesOf } from '../diagnostics/collect';
import { useProblems } from '../diagnostics/useProblems';
import { buildNodes, settledMove, type FlowNode } from './flow';
import { Legend } from './Legend';
import { MeasuredLayer } from './MeasuredLayer';
import { CanvasDrawing } from './CanvasDrawing';
import { RelationNode } from './RelationNode';
import { VariableNode } from './VariableNode';
import { DASH_SCALE_VAR, dashScaleAt } from './zoomDetail';
import { NARROW_CANVAS_PX, canvasFitOptions, fitCanvas } from './fit';
import { GRID_DOT, OVERVIEW_GROUND, OVERVIEW_VIEW, UNKNOWN_STROKE } from '../../theme/tokens';

const nodeTypes = { variable: VariableNode, relation: RelationNode };
// Props of the flow that never change live outside the component: a new array,
// object or function on every render would reach the flow's store as a change
// (one more round of every node's subscriptions per pointer move).
const MULTI_SELECT_KEYS = ['Shift', 'Meta', 'Control'];
const ARIA_LABELS = { 'node.a11yDescription.default': 'Press Enter or Space to select this variable, arrow keys to move it, Delete to remove it.' };
const MINIMAP_STYLE = { width: 150, height: 96 };
// The library is credited in the Keys help (KeysHelp.tsx), not by a mark over the drawing.
const PRO_OPTIONS = { hideAttribution: true };
function minimapColor(n: FlowNode): string {
  const d = n.data as { variable?: { kind: 'input' | 'state' | 'derived' } };
  return d.variable ? ROLE_STYLE[d.variable.kind].stroke : UNKNOWN_STROKE;
}
function applyPicks(current: readonly string[], picks: readonly { id: string; selected: boolean }[]): string[] {
  const set = new Set(current);
  for (const p of picks) {
    if (p.selected) set.add(p.id);
    else set.delete(p.id);
  }
  return [...set];
}
/**
 * A node as the flow draws it. A resting variable is placed with left/top and
 * no transform: a transform per node would make every variable a separate
 * piece the browser sorts into layers on each frame of a drag. A dragged one
 * keeps the flow's transform and gets a layer of its own, so moving it only
 * moves that layer and the resting drawing is not painted again.
 */
const placedCache = new WeakMap<FlowNode, FlowNode>();
function placed(n: FlowNode): FlowNode {
  let p = placedCache.get(n);
  if (!p) {
    p = { ...n, style: n.dragging ? { ...n.style, willChange: 'transform' } : { ...n.style, transform: 'none', left: n.position.x, top: n.position.y } } as FlowNode;
    placedCache.set(n, p);
  }
  return p;
}
const sameList = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x, i) => x === b[i]);

/** The mechanism canvas: variables, links and relations of the document, edited in place. */
export function ModelCanvas() {
  const model = useModel();
  const selNodes = useSelection((s) => s.nodes);
  const problems = useProblems();
  const badges = useMemo(() => badgesOf(problems), [problems]);
  const selectedNodes = useMemo(() => new Set(selNodes), [selNodes]);
  const [nodes, setNodes] = useState<FlowNode[]>([]);
  const shownNodes = useMemo(() => nodes.map(placed), [nodes]);
  const flow = useReactFlow();
  const wrapper = useRef<HTMLDivElement>(null);
  // fit the view once per loaded document, not when the first node of an empty canvas appears
  const generation = useDocument((s) => s.generation);
  const legendOpen = useUi((s) => s.legendOpen);
  // changes only when the zoom crosses a step of the dash scale (zoomDetail.ts), not on every zoom
  const dashScale = useStore((s) => dashScaleAt(s.transform[2]));
  const canvasStyle = useMemo(() => ({ [DASH_SCALE_VAR]: dashScale }) as CSSProperties, [dashScale]);
  // the first Fit goes through the library (before the nodes are measured); every later Fit
  // keeps the drawing clear of the measured overlays (fit.ts) and never below the zoom that keeps
  // its smallest text legible: a big drawing is placed where no overlay covers a node, and panned
  const fitOptions = useMemo<FitViewOptions>(() => canvasFitOptions(legendOpen), [legendOpen]);
  const [fitOnMount] = useState(() => model.variables.length > 0);
  const fitted = useRef(generation);
  // until the modeller pans or zooms, the view keeps the drawing fitted (new document, resized pane)
  const autoFit = useRef(fitOnMount);
  const legendOpenRef = useRef(legendOpen);
  legendOpenRef.current = legendOpen;
  const fitNow = useCallback((duration?: number) => fitCanvas(flow, wrapper.current, legendOpenRef.current, duration), [flow]);
  const nodesMeasured = useNodesInitialized();
  useEffect(() => {
    if (!nodesMeasured || !autoFit.current) return;
    const t = setTimeout(() => fitNow(), 30);
    return () => clearTimeout(t);
  }, [nodesMeasured, fitNow]);
  useEffect(() => {
    if (fitted.current === generation) return;
    fitted.current = generation;
    autoFit.current = true;
    const t = setTimeout(() => fitNow(), 60);
    return () => clearTimeout(t);
  }, [generation, fitNow]);
  // the notation key starts folded on a narrow canvas (a projector): open, it wraps over a third of it
  const [narrow, setNarrow] = useState(false);
  useEffect(() => {
    const el = wrapper.current;
    if (!el || typeof ResizeObserver === 'undefined') return;
    let t: ReturnType<typeof setTimeout> | undefined;
    const ro = new ResizeObserver(() => {
      setNarrow(el.clientWidth < NARROW_CANVAS_PX);
      clearTimeout(t);
      t = setTimeout(() => {
        if (autoFit.current) fitNow();
      }, 50);
    });
    ro.observe(el);
    return () => {
      clearTimeout(t);
      ro.disconnect();
    };
  }, [fitNow]);
  // the key opened or folded: the fitted view makes room for it (or takes the room back)
  const onLegendResize = useCallback(() => {
    if (autoFit.current) setTimeout(() => fitNow(), 30);
  }, [fitNow]);
  const onMoveStart = useCallback((e: MouseEvent | TouchEvent | null) => {
    if (e) autoFit.current = false;
  }, []);

  useEffect(() => {
    setNodes((prev) => buildNodes(model, undefined, badges, selectedNodes, prev));
  }, [model, badges, selectedNodes]);

  useEffect(() => {
    setViewCentreProvider(() => {
      const r = wrapper.current?.getBoundingClientRect();
      if (!r) return { x: 200, y: 150 };
      return flow.screenToFlowPosition({ x: r.left + r.width / 2, y: r.top + r.height / 2 });
    });
  }, [flow]);

  const flowStore = useStoreApi<FlowNode>();
  const onNodesChange = useCallback((changes: NodeChange<FlowNode>[]) => {
    // removals go through the document (the Delete key, useShortcuts); selection goes to the selection store
    const picks = changes.filter((c) => c.type === 'select');
    if (picks.length > 0) {
      const s = selectionStore.getState();
      const next = applyPicks(s.nodes, picks);
      // picking a variable without Shift/Ctrl/Cmd drops the picked links, as a click on the canvas does
      const links = picks.some((p) => p.selected) && !flowStore.getState().multiSelectionActive ? [] : s.links;
      if (!sameList(next, s.nodes) || !sameList(links, s.links)) s.select({ nodes: next, links });
    }
    setNodes((nds) => applyNodeChanges(changes.filter((c) => c.type !== 'remove'), nds));
    // only a position that is no longer moving goes to the document (one drag, one undo step)
    const move = settledMove(changes);
    if (move) editDocument(move.change, { squash: move.squash });
  }, [flowStore]);
  const onPaneClick = useCallback(() => {
    const s = selectionStore.getState();
    if (s.links.length > 0) s.select({ nodes: s.nodes, links: [] });
  }, []);
  const onNodeDragStart = useCallback(() => documentStore.getState().stopGesture(), []);
  const onNodeDragStop = useCallback(() => documentStore.getState().stopGesture(), []);
  const onConnectEnd = useCallback((event: MouseEvent | TouchEvent, state: FinalConnectionState) => {
    const from = state.fromNode?.id;
    if (!from) return;
    let to = state.toNode?.id;
    if (!to || to === from) {
      const pt = 'changedTouches' in event ? event.changedTouches[0] : event;
      const el = document.elementsFromPoint(pt.clientX, pt.clientY).find((x) => x.classList.contains('react-flow__node'));
      to = el?.getAttribute('data-id') ?? undefined;
    }
    if (to && to !== from && model.variables.some((v) => v.id === to)) addLink(from, to);
  }, [model]);

  // every pointer-down on the canvas starts a new undo step (history stop)
  const onPointerDown = useCallback(() => documentStore.getState().stopGesture(), []);
  const onDoubleClick = useCallback((e: ReactMouseEvent) => {
    if (!(e.target as HTMLElement).classList.contains('react-flow__pane')) return;
    addVariable('derived', flow.screenToFlowPosition({ x: e.clientX, y: e.clientY }));
  }, [flow]);
  const onDragOver = useCallback((e: DragEvent) => {
    if (e.dataTransfer.types.includes('Files')) {
      e.preventDefault();
      e.dataTransfer.dropEffect = 'copy';
    }
  }, []);
  const onDrop = useCallback((e: DragEvent) => {
    const file = e.dataTransfer.files[0];
    if (!file) return;
    e.preventDefault();
    void openFile(file);
  }, []);

  return (
    <div className="lf-canvas" ref={wrapper} style={canvasStyle} onPointerDownCapture={onPointerDown} onDoubleClick={onDoubleClick} onDragOver={onDragOver} onDrop={onDrop} aria-label="Mechanism canvas" role="region">
      <ReactFlow
        nodes={shownNodes}
        nodeTypes={nodeTypes}
        onNodesChange={onNodesChange}
        onNodeDragStart={onNodeDragStart}
        onNodeDragStop={onNodeDragStop}
        onPaneClick={onPaneClick}
        onConnectEnd={onConnectEnd}
        onMoveStart={onMoveStart}
        connectionMode={ConnectionMode.Strict}
        connectionRadius={30}
        deleteKeyCode={null}
        multiSelectionKeyCode={MULTI_SELECT_KEYS}
        selectionKeyCode="Shift"
        zoomOnDoubleClick={false}
        minZoom={0.1}
        maxZoom={3}
        fitView={fitOnMount}
        fitViewOptions={fitOptions}
        proOptions={PRO_OPTIONS}
        ariaLabelConfig={ARIA_LABELS}
      >
        <Background variant={BackgroundVariant.Dots} gap={24} size={1.2} color={GRID_DOT} />
        <Controls showInteractive={false} showFitView={false} position="bottom-left" aria-label="Zoom and fit">
          <ControlButton className="react-flow__controls-fitview" onClick={() => fitNow(200)} title="Fit view (F)" aria-label="Fit view">
            <svg viewBox="0 0 16 16" aria-hidden="true"><path d="M1.5 5.5v-4h4M10.5 1.5h4v4M14.5 10.5v4h-4M5.5 14.5h-4v-4" fill="none" stroke="currentColor" strokeWidth="1.6" /><rect x="5.5" y="5.5" width="5" height="5" /></svg>
          </ControlButton>
        </Controls>
        <MiniMap
          position="bottom-right"
          pannable
          zoomable
          ariaLabel="Overview of the canvas"
          nodeColor={minimapColor}
          nodeStrokeWidth={2}
          bgColor={OVERVIEW_GROUND}
          maskColor="rgba(29, 43, 54, 0.10)"
          maskStrokeColor={OVERVIEW_VIEW}
          maskStrokeWidth={2}
          style={MINIMAP_STYLE}
        />
        <CanvasDrawing model={model} />
        <MeasuredLayer model={model} />
        <Legend narrow={narrow} onResize={onLegendResize} />
      </ReactFlow>
      {model.variables.length === 0 && (
        <div className="lf-empty" role="note">
          <p><strong>An empty canvas.</strong> Double-click anywhere (or press <kbd>N</kbd>) to add a variable, then drag from its right edge to another variable to draw a link.</p>
          <p>Or open an example from the gallery.</p>
        </div>
      )}
    </div>
  );
}

