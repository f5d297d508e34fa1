/**
 * Display labels written once for server, PDF and client. A bike reads "2019 Make Model": the
 * year when known, then make and model, skipping whatever is blank.
 */
export interface BikeLabelParts {
  year: number | null | undefined;
  make: string | null | undefined;
  model: string | null | undefined;
}

/** "2019 Make Model"; an unknown year or a blank make or model is left out. */
export function bikeLabel({ year, make, model }: BikeLabelParts): string {
  return [year, make, model].filter((part) => part !== null && part !== undefined && part !== '').join(' ');
}
