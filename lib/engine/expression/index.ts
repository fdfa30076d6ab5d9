/** User models as mathjs expressions: whitelist, compile to JS, forward-mode Jacobian, linear parameters. */
export { compileExpression, type CompiledExpression, type CompileOptions } from "./compile";
export { parseUserExpression, collectSymbols, CONSTANT_SYMBOLS, nestingDepth, ALLOWED_FUNCTIONS, MAX_EXPRESSION_LENGTH, MAX_NODES, MAX_DEPTH } from "./validate";
export { compileValueAndJacobian, MAX_DERIVATIVE_TERMS, type ValueAndJacobian } from "./forward";
export { linearParameters, degreeIn } from "./linearity";
export { compileVector, baseSymbols, type VectorFunction, type SymbolContext } from "./codegen";
