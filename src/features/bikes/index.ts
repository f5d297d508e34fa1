/** The bikes feature's public face, for screens composed in src/app/routes. */
export { bikeRoutes } from './routes';
export { bikeQueries } from './api/bike-queries';
export { BikeDetailsCard } from './components/bike-details-card';
export { BikeFormDialog, type BikeFormDialogProps } from './components/bike-form-dialog';
export { BikeStageGains } from './components/stage-gains/stage-gains-section';
