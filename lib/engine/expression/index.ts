/** User models as mathjs expressions: whitelist, compile to JS, symbolic Jacobian and linearity. */
export { compileExpression, type CompiledExpression, type CompileOptions } from "./compile";
export { parseUserExpression, collectSymbols, ALLOWED_FUNCTIONS, MAX_EXPRESSION_LENGTH, MAX_NODES } from "./validate";
export { compileVector, type VectorFunction } from "./codegen";
