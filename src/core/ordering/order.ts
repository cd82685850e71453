/**
 * From the causal order of an equation structure to the published ordering:
 * the derivatives `x'` of dynamic states are internal unknowns, so they leave
 * the blocks and edges; each rate equation becomes an Integration with one
 * integrating edge per variable it reads (Iwasaki & Simon, "Causality in
 * device behavior", Artificial Intelligence 29, 1986: dynamic causal ordering).
 */
import type { EquationId, VariableId } from '../model/types';
import type { Diagnostic, Integration, OrderingBlock, OrderingEdge } from './types';
import { causalOrder, type CausalOrder, type CausalOrderOptions } from './causal';
import { compareIds, derivativeOf, displayName, stateOfDerivative, type EquationStructure } from './structure';

export interface StructureOrdering {
  blocks: OrderingBlock[];
  edges: OrderingEdge[];
  integrations: Integration[];
  diagnostics: Diagnostic[];
  /** The abstract causal order, derivatives included (for operators that need the matching). */
  causal: CausalOrder;
}

/** "a", "a and b", "a, b and c" (or "a, b or c"). */
export function listNames(names: string[], conjunction: 'and' | 'or' = 'and'): string {
  if (names.length <= 1) return names.join('');
  return `${names.slice(0, -1).join(', ')} ${conjunction} ${names[names.length - 1]}`;
}

function compareEdges(a: OrderingEdge, b: OrderingEdge): number {
  return compareIds(a.to, b.to) || compareIds(a.from, b.from) || compareIds(a.kind, b.kind);
}

/** Diagnostics for the parts of a system that are not self-contained, worded for a modeller. */
function determinationDiagnostics(blocks: OrderingBlock[], structure: EquationStructure): Diagnostic[] {
  const out: Diagnostic[] = [];
  const exo = new Set(structure.exogenous);
  const eqVars = new Map(structure.equations.map((e) => [e.id, e.variables]));
  for (const b of blocks) {
    if (b.determination === 'well') continue;
    const shown = b.variables.map(displayName);
    const states = [...new Set(b.variables.map((v) => stateOfDerivative(v)).filter((x): x is string => x !== null))];
    const vars = [...new Set([...b.variables.filter((v) => stateOfDerivative(v) === null), ...states])].sort(compareIds);
    if (b.determination === 'under') {
      if (b.equations.length === 0) {
        out.push({
          level: 'error',
          code: 'under-determined',
          message: `${listNames(shown)} ${shown.length > 1 ? 'appear' : 'appears'} in no equation, so nothing determines ${shown.length > 1 ? 'them' : 'it'}: give ${shown.length > 1 ? 'each' : 'it'} a formula, or make ${shown.length > 1 ? 'them inputs' : 'it an input'}`,
          variables: vars,
          equations: [],
        });
      } else {
        out.push({
          level: 'error',
          code: 'under-determined',
          message: `${listNames(shown)} ${shown.length > 1 ? 'are' : 'is'} not determined: ${b.equations.length === 1 ? 'the one equation' : `the ${b.equations.length} equations`} ${listNames(b.equations)} cannot fix ${shown.length} unknown${shown.length > 1 ? 's' : ''}; add an equation or make ${shown.length > 1 ? 'one of them' : 'it'} an input`,
          variables: vars,
          equations: b.equations,
        });
      }
    } else if (b.variables.length === 0) {
      const inputs = [...new Set(b.equations.flatMap((e) => eqVars.get(e) ?? []).filter((v) => exo.has(v)))].sort(compareIds);
      out.push({
        level: 'error',
        code: 'constraint-on-inputs',
        message: `equation${b.equations.length > 1 ? 's' : ''} ${listNames(b.equations)} ${b.equations.length > 1 ? 'have' : 'has'} no unknown left: ${b.equations.length > 1 ? 'they are constraints' : 'it is a constraint'} on the inputs${inputs.length ? ` ${listNames(inputs)}` : ''}; remove ${b.equations.length > 1 ? 'them' : 'it'} or let ${b.equations.length > 1 ? 'each' : 'it'} determine a variable that is not an input`,
        variables: inputs,
        equations: b.equations,
      });
    } else {
      out.push({
        level: 'error',
        code: 'over-determined',
        message: `equations ${listNames(b.equations)} over-determine ${listNames(shown)}: ${b.equations.length} equations for ${shown.length} unknown${shown.length > 1 ? 's' : ''}; remove one equation or free a variable that is held or an input`,
        variables: vars,
        equations: b.equations,
      });
    }
  }
  return out;
}

/**
 * Order an equation structure: blocks and edges without derivatives, one
 * Integration per dynamic state, determination diagnostics.
 */
export function orderStructure(structure: EquationStructure, options: CausalOrderOptions = {}): StructureOrdering {
  const causal = causalOrder(structure, options);
  const blocks: OrderingBlock[] = [];
  for (const b of causal.blocks) {
    const vs = b.variables.filter((v) => stateOfDerivative(v) === null);
    if (vs.length === 0 && b.determination === 'well' && b.equations.length > 0 && vs.length < b.variables.length) continue; // a rate equation
    blocks.push(vs.length === b.variables.length ? b : { ...b, variables: vs });
  }
  const diagnostics = determinationDiagnostics(
    causal.blocks.filter((b) => b.determination !== 'well'),
    structure,
  );
  const instantaneous = causal.edges.filter((e) => stateOfDerivative(e.from) === null && stateOfDerivative(e.to) === null);
  const eqById = new Map<EquationId, VariableId[]>(structure.equations.map((e) => [e.id, e.variables]));
  const integrations: Integration[] = [];
  const integrating: OrderingEdge[] = [];
  for (const x of Object.keys(structure.derivatives).sort(compareIds)) {
    const eq = structure.derivatives[x];
    const d = derivativeOf(x);
    const sources = [...new Set((eqById.get(eq) ?? []).filter((v) => v !== d && stateOfDerivative(v) === null))].sort(compareIds);
    integrations.push({ state: x, equation: eq, sources });
    for (const u of sources) if (u !== x) integrating.push({ from: u, to: x, kind: 'integrating', equation: eq });
  }
  integrating.sort(compareEdges);
  // Merge the two sorted lists.
  const edges: OrderingEdge[] = [];
  let i = 0;
  let j = 0;
  while (i < instantaneous.length || j < integrating.length) {
    if (j >= integrating.length || (i < instantaneous.length && compareEdges(instantaneous[i], integrating[j]) <= 0)) edges.push(instantaneous[i++]);
    else edges.push(integrating[j++]);
  }
  return { blocks, edges, integrations, diagnostics, causal };
}
