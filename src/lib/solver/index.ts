/**
 * Roundsmith's plan engine. Pure TypeScript with no I/O: the dispatch screen, the benchmark CLI and
 * the tests all enter here. See docs/solver.md for the rules the engine and the checker apply.
 */
export { problemSchema, createProblem, ProblemError } from './problem';
export type { Problem, ProblemInput, ProblemIssue, Farrier, Barn, Job, TimeWindow } from './problem';
export { solve } from './solve';
export type { SolveOptions, SolveResult, StopRule, Progress, PlannedRoute, PlannedStop, PlannedJob } from './solve';
export { checkSolution, evaluateRoutes } from './checker';
export type { CheckResult, Violation, ViolationCode, RouteInput, CheckedRoute, CheckedStop, RouteTotals } from './checker';
export type { UnplannedReason } from './diagnose';
export { solveInWorker, SolveCancelledError } from './worker';
export type { WorkerSolveOptions } from './worker';
export { solveTsp, tourLength } from './tsp';
export type { TspOptions, TspResult } from './tsp';
