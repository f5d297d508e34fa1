import type { SignedInUser } from '@shared/schemas/auth';

/** The signed-in user as services see it: who, which shop, which role (the /me answer too). */
export type Actor = SignedInUser;
