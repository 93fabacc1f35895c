/**
 * Sweep engine (pure, no I/O): specification, deterministic cases, evaluation, Pareto ranking,
 * summary. Shared by the sweep builder form, the JSON API and the worker.
 */
export * from './spec';
export * from './cases';
export * from './evaluate';
export * from './pareto';
export * from './summary';
export * from './examples';
export { normalCdf, normalQuantile, truncatedNormalInverse } from './distributions';
