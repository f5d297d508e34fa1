/** What the comparisons feature offers other screens (composed in src/app/routes). */
export { ComparisonView } from './components/comparison-view';
export { comparisonQueries } from './api/comparison-queries';
