/** What the plans feature offers other screens (composed in src/app/routes). */
export { BikePlansSection } from './components/bike-plans-section';
