/** The home pages' bike title: the one bike label of src/shared/labels.ts. */
export { bikeLabel as bikeTitle } from '@shared/labels';
