/**
 * The comparisons module's use cases, for callers outside it (the demo archive). Each use case
 * lives in a file of its own; the math is the pure engine in ./engine.
 */
export { evaluateComparison, type EvaluateInput } from './evaluate-comparison';
export { createComparison, deleteComparison, getComparison, listComparisons } from './saved-comparisons';
export { stageTimeline } from './stage-timeline';
export { comparisonCandidates } from './comparison-candidates';
export { describeResult } from './engine';
export type { ComparisonPreview, ComparisonDetailDto } from '@shared/schemas/comparison';
