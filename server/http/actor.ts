import type { Role } from '@shared/roles';

/** The signed-in user as services see it: who, which shop, which role. */
export interface Actor {
  id: string;
  shopId: string;
  role: Role;
  email: string;
  name: string;
  /** For customers: the customer record whose bikes they may see. */
  customerId: string | null;
}
