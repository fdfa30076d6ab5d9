/**
 * Heavy work off the request thread: the worker-thread pool and chains computed within a budget.
 *
 *   computePool()                                  this process's pool (HEATBOOK_COMPUTE_THREADS)
 *   computeChainBounded(steps, ctx, from, state)   computeChainFrom in the pool, stopped steps reported
 *   knownStops / recordStops                       budget stops kept by input hash
 */
export { computePool, ComputePool, defaultBudgetMs, defaultThreads, type ChainTask, type ChainTaskResult } from "./pool";
export { computeChainBounded, budgetFailureText, memoryFailureText, isBudgetFailure, type BoundedChainResult } from "./chain";
export { knownStops, recordStops } from "./stops";
