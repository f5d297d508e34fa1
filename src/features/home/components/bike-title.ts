import type { BikeDto } from '@shared/schemas/bike';

export const bikeTitle = (b: Pick<BikeDto, 'year' | 'make' | 'model'>) => [b.year, b.make, b.model].filter(Boolean).join(' ');
