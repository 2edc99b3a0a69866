// The signed-in person's own account: their password and the devices they are signed in on.
import { z } from 'zod';
import { MAX_EMAIL_LENGTH, MAX_SIGN_IN_PASSWORD_LENGTH, passwordSchema } from './auth';

const currentPasswordSchema = z.string().min(1, 'Enter your current password').max(MAX_SIGN_IN_PASSWORD_LENGTH);

export const changePasswordSchema = z.object({
  currentPassword: currentPasswordSchema,
  newPassword: passwordSchema,
});
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

/** Ending one's own other sessions asks for the password again (ASVS 4.0 3.3.4); no session id = all the others. */
export const endMySessionsSchema = z.object({
  password: currentPasswordSchema,
  sessionId: z.string().min(1).max(64).optional(),
});
export type EndMySessionsInput = z.infer<typeof endMySessionsSchema>;

export const sessionParamSchema = z.object({ id: z.string().min(1).max(64), sessionId: z.string().min(1).max(64) });

export const sessionDto = z.object({
  id: z.string(),
  createdAt: z.string(),
  lastSeenAt: z.string(),
  /** When it ends if not used again (the idle deadline, never after the absolute one). */
  expiresAt: z.string(),
  /** When it ends however much it is used. */
  absoluteExpiresAt: z.string(),
  idleHours: z.number(),
  userAgent: z.string().nullable(),
  ipAddress: z.string().nullable(),
  /** The session making this request. */
  current: z.boolean(),
});
export type SessionDto = z.infer<typeof sessionDto>;

export const sessionsListDto = z.object({ sessions: z.array(sessionDto) });
export type SessionsListDto = z.infer<typeof sessionsListDto>;

/** The form's strength meter asks the server, which holds the common-password lists (too big for the phone). */
export const passwordCheckSchema = z.object({
  password: z.string().max(MAX_SIGN_IN_PASSWORD_LENGTH),
  email: z.string().max(MAX_EMAIL_LENGTH).optional(),
  name: z.string().max(120).optional(),
});
export type PasswordCheckInput = z.infer<typeof passwordCheckSchema>;

export const passwordCheckDto = z.object({
  score: z.number(),
  acceptable: z.boolean(),
  problem: z.string().nullable(),
});
export type PasswordCheckDto = z.infer<typeof passwordCheckDto>;
