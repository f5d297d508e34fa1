/** What the reports feature offers other screens (composed in src/app/routes). */
export { BikeReportsSection } from './components/bike-reports-section';
export { ComparisonReportActions } from './components/comparison-report-actions';
export { CustomerReportsList } from './components/customer-reports-list';
