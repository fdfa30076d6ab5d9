/**
 * Which parameters enter an expression linearly, decided on the tree (no derivatives needed).
 * For a set L of parameters, each node gets a degree in L: 0 (free of L), 1 (affine in L),
 * 2 (anything else). Sums take the larger degree, products add degrees, a quotient keeps the
 * numerator's degree when the denominator is free of L, and a function or power of anything
 * involving L is degree 2. The model is affine in L jointly when the root has degree ≤ 1; then
 * f(x; L, θ) = φ₀(x; θ) + Σ_{p∈L} p φ_p(x; θ) exactly, which the separable solver uses.
 * The rules are sufficient, not necessary: an unusual spelling of a linear term may be
 * classed nonlinear (the fit is then slower, never wrong).
 */
import type { MathNode } from "mathjs";

type AnyNode = MathNode & Record<string, unknown>;

/** Degree (0, 1 or 2 meaning "more") of `node` in the parameters of `set`. */
export function degreeIn(node: MathNode, set: ReadonlySet<string>): number {
  const n = node as AnyNode;
  switch (n.type) {
    case "ConstantNode":
      return 0;
    case "SymbolNode":
      return set.has(String(n.name)) ? 1 : 0;
    case "ParenthesisNode":
      return degreeIn(n.content as MathNode, set);
    case "OperatorNode": {
      const args = (n.args as MathNode[]).map((a) => degreeIn(a, set));
      switch (String(n.fn)) {
        case "unaryMinus":
        case "unaryPlus":
          return args[0];
        case "add":
        case "subtract":
          return Math.max(args[0], args[1]);
        case "multiply":
          return Math.min(2, args[0] + args[1]);
        case "divide":
          return args[1] === 0 ? args[0] : 2;
        default:
          return args.every((d) => d === 0) ? 0 : 2;
      }
    }
    case "FunctionNode":
      return (n.args as MathNode[]).every((a) => degreeIn(a, set) === 0) ? 0 : 2;
    default:
      return 2;
  }
}

/**
 * A set of parameters in which `tree` is jointly affine, chosen greedily in the order given
 * (each parameter joins when the model stays affine in the set with it).
 */
export function linearParameters(tree: MathNode, names: readonly string[]): string[] {
  const set = new Set<string>();
  for (const name of names) {
    set.add(name);
    if (degreeIn(tree, set) > 1) set.delete(name);
  }
  return names.filter((n) => set.has(n));
}
