/**
 * Compile a validated formula tree (from parse.ts) into a plain JS function
 * `(vars: Float64Array) => number`.
 *
 * The generated code is built only from the tree's node types, never from the
 * user's text: each whitelisted operator and function maps to a fixed piece of
 * code, numbers are re-emitted from their numeric value (checked to be finite
 * and to print as a plain numeric literal), and every variable becomes an
 * array slot `v[7]`, so no name from the model ever reaches the code. If the
 * environment forbids generated code (a strict content policy), the same tree
 * is turned into nested closures instead.
 */
import type { MathNode } from 'mathjs';
import { ALLOWED_CONSTANTS, ALLOWED_FUNCTIONS } from './parse';

export type CompiledExpression = (vars: Float64Array) => number;

/** Where each variable lives in the value array. */
export type SlotMap = ReadonlyMap<string, number>;

/** JS for each function; the derivative-only ones appear in mathjs's derivatives of whitelisted functions. */
const FUNCTION_CODE: Record<string, (args: string[]) => string> = {
  abs: (a) => `Math.abs(${a[0]})`,
  exp: (a) => `Math.exp(${a[0]})`,
  log: (a) => (a.length === 2 ? `(Math.log(${a[0]})/Math.log(${a[1]}))` : `Math.log(${a[0]})`),
  log10: (a) => `Math.log10(${a[0]})`,
  log2: (a) => `Math.log2(${a[0]})`,
  sqrt: (a) => `Math.sqrt(${a[0]})`,
  cbrt: (a) => `Math.cbrt(${a[0]})`,
  sin: (a) => `Math.sin(${a[0]})`,
  cos: (a) => `Math.cos(${a[0]})`,
  tan: (a) => `Math.tan(${a[0]})`,
  asin: (a) => `Math.asin(${a[0]})`,
  acos: (a) => `Math.acos(${a[0]})`,
  atan: (a) => `Math.atan(${a[0]})`,
  atan2: (a) => `Math.atan2(${a[0]},${a[1]})`,
  sinh: (a) => `Math.sinh(${a[0]})`,
  cosh: (a) => `Math.cosh(${a[0]})`,
  tanh: (a) => `Math.tanh(${a[0]})`,
  min: (a) => `Math.min(${a.join(',')})`,
  max: (a) => `Math.max(${a.join(',')})`,
  pow: (a) => `Math.pow(${a[0]},${a[1]})`,
  sign: (a) => `Math.sign(${a[0]})`,
  // Appear only in derivatives produced by mathjs:
  sec: (a) => `(1/Math.cos(${a[0]}))`,
  csc: (a) => `(1/Math.sin(${a[0]}))`,
  cot: (a) => `(1/Math.tan(${a[0]}))`,
  sech: (a) => `(1/Math.cosh(${a[0]}))`,
  csch: (a) => `(1/Math.sinh(${a[0]}))`,
  coth: (a) => `(1/Math.tanh(${a[0]}))`,
};

const FUNCTION_VALUE: Record<string, (...x: number[]) => number> = {
  abs: Math.abs, exp: Math.exp, log: (x, b) => (b === undefined ? Math.log(x) : Math.log(x) / Math.log(b)), log10: Math.log10, log2: Math.log2,
  sqrt: Math.sqrt, cbrt: Math.cbrt, sin: Math.sin, cos: Math.cos, tan: Math.tan, asin: Math.asin, acos: Math.acos, atan: Math.atan,
  atan2: Math.atan2, sinh: Math.sinh, cosh: Math.cosh, tanh: Math.tanh, min: Math.min, max: Math.max, pow: Math.pow, sign: Math.sign,
  sec: (x) => 1 / Math.cos(x), csc: (x) => 1 / Math.sin(x), cot: (x) => 1 / Math.tan(x),
  sech: (x) => 1 / Math.cosh(x), csch: (x) => 1 / Math.sinh(x), coth: (x) => 1 / Math.tanh(x),
};

const OPERATOR_CODE: Record<string, (a: string[]) => string> = {
  add: (a) => `(${a[0]}+${a[1]})`,
  subtract: (a) => `(${a[0]}-${a[1]})`,
  multiply: (a) => `(${a[0]}*${a[1]})`,
  divide: (a) => `(${a[0]}/${a[1]})`,
  pow: (a) => `Math.pow(${a[0]},${a[1]})`,
  unaryMinus: (a) => `(-${a[0]})`,
  unaryPlus: (a) => `(+${a[0]})`,
};

const OPERATOR_VALUE: Record<string, (a: number, b: number) => number> = {
  add: (a, b) => a + b,
  subtract: (a, b) => a - b,
  multiply: (a, b) => a * b,
  divide: (a, b) => a / b,
  pow: Math.pow,
  unaryMinus: (a) => -a,
  unaryPlus: (a) => +a,
};

const NUMERIC_LITERAL = /^[0-9]+(\.[0-9]+)?(e[+-]?[0-9]+)?$/;

export class CompileError extends Error {}

/** A finite number as JS source that can only be that number. */
function literal(v: unknown): string {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new CompileError(`only finite numbers can be compiled, not ${String(v)}`);
  const s = String(Math.abs(v));
  if (!NUMERIC_LITERAL.test(s)) throw new CompileError(`unexpected number form ${s}`);
  return v < 0 || Object.is(v, -0) ? `(-${s})` : s;
}

function slotOf(name: string, slots: SlotMap): number {
  const s = slots.get(name);
  if (s === undefined || !Number.isInteger(s) || s < 0) throw new CompileError(`"${name}" is not a variable of this model`);
  return s;
}

function functionName(n: MathNode & Record<string, unknown>): string {
  const fnNode = n.fn as MathNode & { name?: string };
  const name = fnNode && fnNode.type === 'SymbolNode' ? fnNode.name : undefined;
  if (typeof name !== 'string' || !Object.prototype.hasOwnProperty.call(FUNCTION_CODE, name)) throw new CompileError(`the function ${String(name)} cannot be compiled`);
  return name;
}

function emit(node: MathNode, slots: SlotMap): string {
  const n = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'ConstantNode':
      return literal(n.value);
    case 'SymbolNode': {
      const name = n.name as string;
      if (Object.prototype.hasOwnProperty.call(ALLOWED_CONSTANTS, name)) return literal(ALLOWED_CONSTANTS[name]);
      return `v[${slotOf(name, slots)}]`;
    }
    case 'ParenthesisNode':
      return `(${emit(n.content as MathNode, slots)})`;
    case 'OperatorNode': {
      const fn = n.fn as string;
      const args = (n.args as MathNode[]).map((a) => emit(a, slots));
      const code = Object.prototype.hasOwnProperty.call(OPERATOR_CODE, fn) ? OPERATOR_CODE[fn] : undefined;
      const arity = fn === 'unaryMinus' || fn === 'unaryPlus' ? 1 : 2;
      if (!code || args.length !== arity) throw new CompileError(`the operator ${fn} cannot be compiled`);
      return code(args);
    }
    case 'FunctionNode': {
      const name = functionName(n);
      const args = (n.args as MathNode[]).map((a) => emit(a, slots));
      const spec = ALLOWED_FUNCTIONS[name];
      if (spec && (args.length < spec.minArgs || args.length > spec.maxArgs)) throw new CompileError(`${name} has the wrong number of arguments`);
      return FUNCTION_CODE[name](args);
    }
    default:
      throw new CompileError(`a ${node.type} cannot be compiled`);
  }
}

function closure(node: MathNode, slots: SlotMap): CompiledExpression {
  const n = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'ConstantNode': {
      const c = Number(literal(n.value).replace(/[()]/g, ''));
      return () => c;
    }
    case 'SymbolNode': {
      const name = n.name as string;
      if (Object.prototype.hasOwnProperty.call(ALLOWED_CONSTANTS, name)) {
        const c = ALLOWED_CONSTANTS[name];
        return () => c;
      }
      const s = slotOf(name, slots);
      return (v) => v[s];
    }
    case 'ParenthesisNode':
      return closure(n.content as MathNode, slots);
    case 'OperatorNode': {
      const fn = n.fn as string;
      const op = Object.prototype.hasOwnProperty.call(OPERATOR_VALUE, fn) ? OPERATOR_VALUE[fn] : undefined;
      if (!op) throw new CompileError(`the operator ${fn} cannot be compiled`);
      const args = (n.args as MathNode[]).map((a) => closure(a, slots));
      if (args.length === 1) { const a = args[0]; return (v) => op(a(v), 0); }
      const [a, b] = args;
      return (v) => op(a(v), b(v));
    }
    case 'FunctionNode': {
      const f = FUNCTION_VALUE[functionName(n)];
      const args = (n.args as MathNode[]).map((a) => closure(a, slots));
      return (v) => f(...args.map((a) => a(v)));
    }
    default:
      throw new CompileError(`a ${node.type} cannot be compiled`);
  }
}

let generatedCodeAllowed: boolean | undefined;

/**
 * Compile a tree from parseExpression. Example:
 * `compileExpression(parseExpression("k*(a-b)").node, new Map([["k",0],["a",1],["b",2]]))(Float64Array.of(2,5,3))` → 4.
 */
export function compileExpression(node: MathNode, slots: SlotMap): CompiledExpression {
  const code = emit(node, slots);
  if (generatedCodeAllowed !== false) {
    try {
      // Safe by construction: `code` contains only fixed operator/function
      // templates, numeric literals and `v[<integer>]` (see emit).
      const fn = new Function('v', `"use strict"; return ${code};`) as CompiledExpression;
      generatedCodeAllowed = true;
      return fn;
    } catch (e) {
      if (!(e instanceof EvalError)) throw e;
      generatedCodeAllowed = false;
    }
  }
  return closure(node, slots);
}

/** The closure form, always available (used where generated code is forbidden, and in tests). */
export function compileExpressionClosure(node: MathNode, slots: SlotMap): CompiledExpression {
  return closure(node, slots);
}
