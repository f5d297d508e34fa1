/** What the runs feature offers other screens (composed in src/app/routes). */
export { BikeBuildTimeline } from './components/build-timeline';
export { BikeRunsSection } from './components/bike-runs-section';
export { runQueries } from './api/run-queries';
export { stageQueries } from './api/stage-queries';
export { sessionQueries } from './api/session-queries';
