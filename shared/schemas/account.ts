// One's own account: signing in and out, one's password and devices, and the one-time links (invitation, password
// reset) that set a password.
import { z } from 'zod';
import { ROLES } from '../permissions';

export const MAX_EMAIL_LENGTH = 254;
/** ASVS 4.0 2.1.1 and 2.1.2: at least 12 characters, and up to 128 (longer passphrases are welcome up to there). */
export const MIN_PASSWORD_LENGTH = 12;
export const MAX_PASSWORD_LENGTH = 128;
/** Sign-in still accepts the longer passwords an earlier rule allowed (up to 200). */
export const MAX_SIGN_IN_PASSWORD_LENGTH = 200;

/** What the password fields say under them, so the person knows the rule before the server refuses. */
export const PASSWORD_RULE_HINT = `At least ${MIN_PASSWORD_LENGTH} characters. A few unrelated words make a good one; common passwords and your own name or e-mail are refused.`;

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(MAX_EMAIL_LENGTH, 'E-mail address is too long')
  .pipe(z.email('Enter a valid e-mail address'));

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(MAX_SIGN_IN_PASSWORD_LENGTH),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const passwordSchema = z
  .string()
  .min(MIN_PASSWORD_LENGTH, `Use at least ${MIN_PASSWORD_LENGTH} characters`)
  .max(MAX_PASSWORD_LENGTH, 'Password is too long');

export const userDto = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  certificateNumber: z.string().nullable(),
  certificateExpiresOn: z.string().nullable(),
  active: z.boolean(),
  createdAt: z.string(),
});
export type UserDto = z.infer<typeof userDto>;

export const meDto = z.object({ user: userDto });
export type MeDto = z.infer<typeof meDto>;

// ---- One-time links by e-mail ----

/** Invitation and password-reset links carry a random token; a malformed one is simply unknown (404). */
export const linkTokenParamSchema = z.object({ token: z.string().min(1).max(128) });

export const setPasswordSchema = z.object({ password: passwordSchema });
export type SetPasswordInput = z.infer<typeof setPasswordSchema>;

export const requestPasswordResetSchema = z.object({ email: emailSchema });
export type RequestPasswordResetInput = z.infer<typeof requestPasswordResetSchema>;

/** What a link page shows before the person types a password. */
export const accountLinkDto = z.object({ email: z.string(), name: z.string(), expiresAt: z.string() });
export type AccountLinkDto = z.infer<typeof accountLinkDto>;
export const accountLinkResponseDto = z.object({ link: accountLinkDto });
export type AccountLinkResponseDto = z.infer<typeof accountLinkResponseDto>;

export const INVITATION_HOURS = 72;
export const PASSWORD_RESET_HOURS = 1;

// ---- Password and devices ----

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

/** How many of one's other sessions a sign-out ended. */
export const endedSessionsDto = z.object({ ended: z.number() });
export type EndedSessionsDto = z.infer<typeof endedSessionsDto>;

/** After a password change: how many other sessions were ended with it. */
export const passwordChangedDto = z.object({ endedSessions: z.number() });
export type PasswordChangedDto = z.infer<typeof passwordChangedDto>;

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
