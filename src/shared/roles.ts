/** Who a signed-in user is to the shop. Shared by the server's guards and the client's navigation. */
export const ROLES = ['owner', 'tuner', 'desk', 'customer'] as const;
export type Role = (typeof ROLES)[number];

/** Shop staff: everyone but customers. */
export const STAFF: readonly Role[] = ['owner', 'tuner', 'desk'];
/** Roles that upload and edit runs and stages. */
export const WORKSHOP: readonly Role[] = ['owner', 'tuner'];

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  tuner: 'Tuner',
  desk: 'Front desk',
  customer: 'Customer',
};
