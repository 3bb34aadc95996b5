import { z } from 'zod';
import { emailSchema, singleLineText } from './common.js';

/** bcrypt reads only the first 72 bytes, so longer passwords are refused rather than silently truncated. */
export const PASSWORD_MAX_BYTES = 72;
export const PASSWORD_MIN_LENGTH = 8;

export const newPasswordSchema = z
  .string()
  .min(PASSWORD_MIN_LENGTH, { message: `Use at least ${PASSWORD_MIN_LENGTH} characters.` })
  .refine((s) => new TextEncoder().encode(s).length <= PASSWORD_MAX_BYTES, {
    message: `At most ${PASSWORD_MAX_BYTES} bytes (fewer when using accented letters or symbols).`,
  });

export const loginSchema = z.strictObject({
  email: emailSchema,
  password: z.string().min(1, { message: 'Required.' }).max(1024, { message: 'Too long.' }),
});
export type LoginInput = z.infer<typeof loginSchema>;

export const passwordChangeSchema = z.strictObject({
  currentPassword: z.string().min(1, { message: 'Required.' }).max(1024),
  newPassword: newPasswordSchema,
});

export const passwordResetRequestSchema = z.strictObject({ email: emailSchema });

export const passwordResetConfirmSchema = z.strictObject({
  token: z.string().min(16).max(256),
  password: newPasswordSchema,
});

export const acceptInvitationSchema = z.strictObject({
  token: z.string().min(16).max(256),
  name: singleLineText(120),
  password: newPasswordSchema,
});

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  role: import('../roles.js').Role;
  operationId: string;
  operationName: string;
  partyId: string | null;
}

export interface LoginResponse {
  accessToken: string;
  expiresIn: number;
  user: SessionUser;
}
