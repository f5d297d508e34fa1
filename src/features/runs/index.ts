/** What the runs feature offers other screens (composed in src/app/routes). */
export { BikeBuildTimeline } from './components/stages/build-timeline';
export { BikeRunsSection } from './components/bike-runs-section';
export { runQueries } from './api/runs/run-queries';
export { stageQueries } from './api/stages/stage-queries';
export { sessionQueries } from './api/sessions/session-queries';
