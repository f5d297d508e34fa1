/** What the finder feature offers other screens (composed in src/app/routes). */
export { SimilarBuilds, type SimilarBuildsProps } from './components/similar-builds';
export { TypicalOutcomePanel, type TypicalOutcomePanelProps } from './components/typical-outcome-panel';
