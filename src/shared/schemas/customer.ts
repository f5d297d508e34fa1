import { z } from 'zod';
import { listQuery, optionalEmail, optionalText, requiredText } from './common';

/** Create or edit a customer (front desk form and POST/PATCH /api/customers). */
export const customerInput = z.object({
  name: requiredText(200, 'Name'),
  email: optionalEmail,
  phone: optionalText(60),
  notes: optionalText(5000),
});
export type CustomerInput = z.input<typeof customerInput>;

export const CUSTOMER_SORTS = ['name', 'createdAt', 'email'] as const;
export const customerListQuery = listQuery(CUSTOMER_SORTS);

export interface CustomerDto {
  id: string;
  name: string;
  email: string | null;
  phone: string | null;
  notes: string | null;
  bikeCount: number;
  hasPortalAccess: boolean;
  createdAt: string;
}
