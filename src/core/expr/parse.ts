import { create, parseDependencies, type MathNode } from 'mathjs';

/**
 * The restricted expression language of Loopfold formulas.
 *
 * Formulas are parsed with mathjs's parser only (nothing is evaluated here),
 * then the syntax tree is checked against a whitelist: numbers, the model's
 * variable names, `pi` and `e`, the operators + - * / ^, parentheses and the
 * functions in ALLOWED_FUNCTIONS. Anything else (assignments, function
 * definitions, property access, matrices, strings, blocks) is refused with a
 * message that says what and where.
 */
const math = create({ parseDependencies });

export const ALLOWED_FUNCTIONS: Record<string, { minArgs: number; maxArgs: number }> = {
  abs: { minArgs: 1, maxArgs: 1 },
  exp: { minArgs: 1, maxArgs: 1 },
  log: { minArgs: 1, maxArgs: 1 },
  log10: { minArgs: 1, maxArgs: 1 },
  log2: { minArgs: 1, maxArgs: 1 },
  sqrt: { minArgs: 1, maxArgs: 1 },
  cbrt: { minArgs: 1, maxArgs: 1 },
  sin: { minArgs: 1, maxArgs: 1 },
  cos: { minArgs: 1, maxArgs: 1 },
  tan: { minArgs: 1, maxArgs: 1 },
  asin: { minArgs: 1, maxArgs: 1 },
  acos: { minArgs: 1, maxArgs: 1 },
  atan: { minArgs: 1, maxArgs: 1 },
  atan2: { minArgs: 2, maxArgs: 2 },
  sinh: { minArgs: 1, maxArgs: 1 },
  cosh: { minArgs: 1, maxArgs: 1 },
  tanh: { minArgs: 1, maxArgs: 1 },
  min: { minArgs: 2, maxArgs: 8 },
  max: { minArgs: 2, maxArgs: 8 },
  pow: { minArgs: 2, maxArgs: 2 },
  sign: { minArgs: 1, maxArgs: 1 },
};
export const ALLOWED_CONSTANTS: Record<string, number> = { pi: Math.PI, e: Math.E };
export const ALLOWED_OPERATORS = new Set(['add', 'subtract', 'multiply', 'divide', 'pow', 'unaryMinus', 'unaryPlus']);

const own = (table: object, name: string): boolean => Object.prototype.hasOwnProperty.call(table, name);
const isFunctionName = (name: string): boolean => own(ALLOWED_FUNCTIONS, name);
const isConstantName = (name: string): boolean => own(ALLOWED_CONSTANTS, name);

/** Names a variable may not take, because formulas would read them as functions or constants. */
export function isReservedName(name: string): boolean {
  return isFunctionName(name) || isConstantName(name);
}

export interface ExpressionError {
  message: string;
  /** 0-based character offset in the text, when known. */
  position?: number;
  /** Names used in the formula that the model does not define. */
  unknown?: string[];
}

export type ParsedExpression =
  | { ok: true; node: MathNode; symbols: string[] }
  | { ok: false; error: ExpressionError };

const MAX_LENGTH = 4000;
const MAX_DEPTH = 200;

function check(node: MathNode, symbols: Set<string>, depth: number): ExpressionError | null {
  if (depth > MAX_DEPTH) return { message: 'the formula is nested too deeply' };
  const n = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'ConstantNode': {
      const v = n.value;
      if (typeof v !== 'number' || !Number.isFinite(v)) return { message: `only numbers may appear as constants, not ${JSON.stringify(v)}` };
      return null;
    }
    case 'SymbolNode': {
      const name = n.name as string;
      if (isFunctionName(name)) return { message: `"${name}" is a function: write ${name}(…)` };
      if (!isConstantName(name)) symbols.add(name);
      return null;
    }
    case 'ParenthesisNode':
      return check(n.content as MathNode, symbols, depth + 1);
    case 'OperatorNode': {
      const fn = n.fn as string;
      if (!ALLOWED_OPERATORS.has(fn)) return { message: `the operator "${n.op as string}" is not allowed in formulas (use + - * / ^)` };
      for (const a of n.args as MathNode[]) {
        const e = check(a, symbols, depth + 1);
        if (e) return e;
      }
      return null;
    }
    case 'FunctionNode': {
      const fnNode = n.fn as MathNode & { name?: string };
      if (fnNode.type !== 'SymbolNode' || typeof fnNode.name !== 'string') return { message: 'only named functions such as exp(x) may be called' };
      const spec = isFunctionName(fnNode.name) ? ALLOWED_FUNCTIONS[fnNode.name] : undefined;
      if (!spec)
        return { message: `"${fnNode.name}" is not a function formulas can use; allowed: ${Object.keys(ALLOWED_FUNCTIONS).join(', ')}` };
      const args = n.args as MathNode[];
      if (args.length < spec.minArgs || args.length > spec.maxArgs)
        return { message: `${fnNode.name} takes ${spec.minArgs === spec.maxArgs ? spec.minArgs : `${spec.minArgs} to ${spec.maxArgs}`} argument${spec.maxArgs > 1 ? 's' : ''}, not ${args.length}` };
      for (const a of args) {
        const e = check(a, symbols, depth + 1);
        if (e) return e;
      }
      return null;
    }
    case 'AssignmentNode':
    case 'FunctionAssignmentNode':
      return { message: 'a formula may not assign or define anything: write only the expression (for an equation between two sides, add a relation)' };
    default:
      return { message: `this kind of expression (${node.type.replace(/Node$/, '').toLowerCase()}) is not allowed in formulas` };
  }
}

function positionOf(message: string): number | undefined {
  const m = /\(char (\d+)\)/.exec(message);
  return m ? Math.max(0, Number(m[1]) - 1) : undefined;
}

/**
 * Parse and whitelist-check a formula. With `known`, names outside it are
 * reported as unknown. Example: `parseExpression("k*(a - b)", new Set(["k","a","b"]))`.
 */
export function parseExpression(text: string, known?: ReadonlySet<string>): ParsedExpression {
  if (typeof text !== 'string') return { ok: false, error: { message: 'the formula must be text' } };
  if (text.length > MAX_LENGTH) return { ok: false, error: { message: `the formula is longer than ${MAX_LENGTH} characters` } };
  if (text.trim() === '') return { ok: false, error: { message: 'the formula is empty', position: 0 } };
  let node: MathNode;
  try {
    node = math.parse(text);
  } catch (e) {
    const msg = (e as Error).message;
    return { ok: false, error: { message: `syntax error: ${msg.replace(/\s*\(char \d+\)/, '')}`, position: positionOf(msg) } };
  }
  const symbols = new Set<string>();
  const err = check(node, symbols, 0);
  if (err) return { ok: false, error: err };
  const list = [...symbols].sort();
  if (known) {
    const unknown = list.filter((s) => !known.has(s));
    if (unknown.length > 0)
      return {
        ok: false,
        error: { message: `unknown name${unknown.length > 1 ? 's' : ''}: ${unknown.join(', ')} (not a variable of this model)`, unknown },
      };
  }
  return { ok: true, node, symbols: list };
}

/**
 * Split an implicit relation `lhs = rhs` at its single top-level "=".
 * Returns the two sides' texts and the offset of the right side.
 */
export function splitRelation(text: string): { ok: true; lhs: string; rhs: string; rhsOffset: number } | { ok: false; error: ExpressionError } {
  const positions: number[] = [];
  for (let i = 0; i < text.length; i++) {
    if (text[i] !== '=') continue;
    const prev = text[i - 1];
    const next = text[i + 1];
    if (prev === '<' || prev === '>' || prev === '!' || prev === '=' || next === '=') continue;
    positions.push(i);
  }
  if (positions.length !== 1)
    return {
      ok: false,
      error: { message: positions.length === 0 ? 'a relation needs one "=" between its two sides, such as a*b = c*d' : 'a relation has exactly one "="', position: positions[1] },
    };
  const at = positions[0];
  return { ok: true, lhs: text.slice(0, at), rhs: text.slice(at + 1), rhsOffset: at + 1 };
}

/** Parse a relation `lhs = rhs` into the residual `lhs - (rhs)` with its symbols. */
export function parseRelation(text: string, known?: ReadonlySet<string>): ParsedExpression {
  const split = splitRelation(text);
  if (!split.ok) return split;
  const l = parseExpression(split.lhs, known);
  if (!l.ok) return l;
  const r = parseExpression(split.rhs, known);
  if (!r.ok) {
    if (r.error.position !== undefined) r.error.position += split.rhsOffset;
    return r;
  }
  const node = new math.OperatorNode('-', 'subtract', [l.node, new math.ParenthesisNode(r.node)]);
  return { ok: true, node, symbols: [...new Set([...l.symbols, ...r.symbols])].sort() };
}
