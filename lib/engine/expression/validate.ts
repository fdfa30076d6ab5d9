/**
 * Whitelist check of an untrusted user expression parsed by mathjs.
 *
 * Allowed: finite number literals, symbols (the variable, named parameters, pi, e),
 * + − * / ^ (binary), unary minus/plus, parentheses, implicit multiplication, and calls
 * to the functions in ALLOWED_FUNCTIONS. Everything else — assignments, function
 * definitions, property access, indexing, strings, matrices, objects, ranges, conditionals,
 * comparisons, and calls such as import/createUnit/evaluate/parse/simplify/derivative —
 * is refused with an InputError that names the column in the expression.
 * Limits: MAX_EXPRESSION_LENGTH characters, MAX_NODES tree nodes and MAX_DEPTH levels of
 * nesting (operators and calls inside one another; parentheses do not count). Each refusal
 * names the limit. The derivative's size has its own limit (forward.ts).
 */
import { parse, type MathNode } from "mathjs";
import { InputError } from "../errors";

export const MAX_EXPRESSION_LENGTH = 500;
export const MAX_NODES = 300;
export const MAX_DEPTH = 64;

/** Function name → arity accepted in user expressions. */
export const ALLOWED_FUNCTIONS: Readonly<Record<string, readonly number[]>> = Object.freeze({
  exp: [1], log: [1, 2], log10: [1], sqrt: [1], sin: [1], cos: [1], tan: [1], atan: [1],
  sinh: [1], cosh: [1], tanh: [1], abs: [1], pow: [2],
});
const OPERATORS = new Set(["add", "subtract", "multiply", "divide", "pow", "unaryMinus", "unaryPlus"]);
export const CONSTANT_SYMBOLS = new Set(["pi", "e"]);

function column(text: string, token: string): number | undefined {
  const at = text.indexOf(token);
  return at >= 0 ? at + 1 : undefined;
}

function refuse(text: string, what: string, token: string): never {
  const col = column(text, token);
  throw new InputError(`invalid expression: ${what}`, { field: "expression", column: col });
}

type AnyNode = MathNode & Record<string, unknown>;

function checkNode(node: AnyNode, text: string): void {
  switch (node.type) {
    case "ConstantNode":
      if (typeof node.value !== "number" || !Number.isFinite(node.value)) refuse(text, `only numbers are allowed as literals`, String(node.value));
      return;
    case "SymbolNode":
    case "ParenthesisNode":
      return;
    case "OperatorNode": {
      const fn = String(node.fn);
      if (!OPERATORS.has(fn)) refuse(text, `operator "${String(node.op)}" is not allowed`, String(node.op));
      return;
    }
    case "FunctionNode": {
      const fnNode = node.fn as AnyNode;
      const name = fnNode.type === "SymbolNode" ? String(fnNode.name) : "";
      const arity = Object.prototype.hasOwnProperty.call(ALLOWED_FUNCTIONS, name) ? ALLOWED_FUNCTIONS[name] : undefined;
      if (!name || !arity) refuse(text, `function "${name || "?"}" is not allowed (allowed: ${Object.keys(ALLOWED_FUNCTIONS).join(", ")})`, name ? `${name}(` : "(");
      const nArgs = (node.args as unknown[]).length;
      if (!arity.includes(nArgs)) refuse(text, `${name} takes ${arity.join(" or ")} argument(s), got ${nArgs}`, `${name}(`);
      return;
    }
    default: {
      const hints: Record<string, string> = { AccessorNode: ".", IndexNode: "[", ArrayNode: "[", ObjectNode: "{", AssignmentNode: "=", FunctionAssignmentNode: "=", BlockNode: ";", ConditionalNode: "?", RangeNode: ":", RelationalNode: "<" };
      refuse(text, `${node.type.replace("Node", "").toLowerCase()} is not allowed`, hints[node.type] ?? text);
    }
  }
}

/** Parse and whitelist `text`; returns the mathjs tree. Throws InputError on anything refused. */
export function parseUserExpression(text: string): MathNode {
  if (typeof text !== "string" || text.trim() === "") throw new InputError("invalid expression: empty", { field: "expression" });
  if (text.length > MAX_EXPRESSION_LENGTH) {
    throw new InputError(`invalid expression: ${text.length} characters, at most ${MAX_EXPRESSION_LENGTH} allowed`, { field: "expression", column: MAX_EXPRESSION_LENGTH + 1 });
  }
  let tree: MathNode;
  try {
    tree = parse(text);
  } catch (err) {
    const e = err as Error & { char?: number };
    throw new InputError(`invalid expression: ${e.message}`, { field: "expression", column: typeof e.char === "number" ? e.char : undefined });
  }
  let count = 0;
  tree.traverse((node, path, parent) => {
    count++;
    // the SymbolNode naming a called function is checked with its FunctionNode
    if (parent && parent.type === "FunctionNode" && path === "fn") return;
    checkNode(node as AnyNode, text);
  });
  if (count > MAX_NODES) throw new InputError(`invalid expression: ${count} nodes, at most ${MAX_NODES} allowed`, { field: "expression" });
  const depth = nestingDepth(tree);
  if (depth > MAX_DEPTH) throw new InputError(`invalid expression: nesting depth ${depth}, at most ${MAX_DEPTH} allowed (limit on nesting depth)`, { field: "expression" });
  return tree;
}

/** Levels of operators and calls inside one another (parentheses not counted). */
export function nestingDepth(tree: MathNode): number {
  const n = tree as AnyNode;
  if (n.type === "ParenthesisNode") return nestingDepth(n.content as MathNode);
  const args = n.type === "OperatorNode" || n.type === "FunctionNode" ? (n.args as MathNode[]) : [];
  return 1 + args.reduce((d, a) => Math.max(d, nestingDepth(a)), 0);
}

/** Symbols used as values (not called as functions), in order of first appearance. */
export function collectSymbols(tree: MathNode): string[] {
  const seen: string[] = [];
  tree.traverse((node, path, parent) => {
    if (node.type !== "SymbolNode") return;
    if (parent && parent.type === "FunctionNode" && path === "fn") return;
    const name = String((node as AnyNode).name);
    if (!seen.includes(name)) seen.push(name);
  });
  return seen;
}
