import { z } from 'zod';
import { ROLES, type Role } from '../roles';

/** The signed-in user: what services see as the actor and what GET /api/auth/me answers. */
export interface SignedInUser {
  id: string;
  shopId: string;
  role: Role;
  email: string;
  name: string;
  /** For customers: the customer record whose bikes they may see. */
  customerId: string | null;
}

export const passwordSchema = z.string().min(10, 'Use at least 10 characters').max(200, 'At most 200 characters');

export const loginInput = z.object({
  email: z.string().trim().toLowerCase().email('Enter a valid e-mail address'),
  password: z.string().min(1, 'Enter your password').max(200),
});

export const changePasswordInput = z.object({
  currentPassword: z.string().min(1, 'Enter your current password'),
  newPassword: passwordSchema,
});

export const forgotPasswordInput = z.object({ email: z.string().trim().toLowerCase().email('Enter a valid e-mail address') });

export const setPasswordInput = z.object({
  token: z.string().min(20).max(200),
  password: passwordSchema,
  name: z.string().trim().min(1).max(200).optional(),
});

export const inviteUserInput = z.object({
  email: z.string().trim().toLowerCase().email('Enter a valid e-mail address'),
  name: z.string().trim().min(1, 'Name is required').max(200),
  role: z.enum(ROLES),
  customerId: z.string().uuid().optional(),
});

export const updateUserInput = z.object({
  name: z.string().trim().min(1).max(200).optional(),
  role: z.enum(ROLES).optional(),
  disabled: z.boolean().optional(),
});

export type LoginInput = z.infer<typeof loginInput>;
export type InviteUserInput = z.infer<typeof inviteUserInput>;

/** A user as GET /api/users lists them. */
export interface UserDto {
  id: string;
  email: string;
  name: string;
  role: Role;
  disabled: boolean;
  invitePending: boolean;
  customerId: string | null;
  lastLoginAt: string | null;
}

/** One line of the shop's audit log (GET /api/audit). */
export interface AuditEntryDto {
  id: string;
  at: string;
  userName: string | null;
  action: string;
  entityType: string;
  entityId: string;
  details: Record<string, unknown> | null;
}

/** POST /api/auth/login and /api/auth/set-password: the user now signed in. */
export interface SignInDto {
  user: SignedInUser;
}

/** GET /api/auth/token/:token: whose invitation or reset link this is. */
export interface TokenInfoDto {
  purpose: 'invite' | 'reset';
  email: string;
  name: string;
}

/** POST /api/auth/forgot: the same words whether or not the address has an account. */
export interface ForgotPasswordDto {
  ok: true;
  message: string;
}
