import { z } from 'zod';
import { emailSchema, passwordSchema } from './auth';

/** Invitation and password-reset links carry a random token; a malformed one is simply unknown (404). */
export const linkTokenParamSchema = z.object({ token: z.string().min(1).max(128) });

export const setPasswordSchema = z.object({ password: passwordSchema });
export type SetPasswordInput = z.infer<typeof setPasswordSchema>;

export const requestPasswordResetSchema = z.object({ email: emailSchema });
export type RequestPasswordResetInput = z.infer<typeof requestPasswordResetSchema>;

/** What a link page shows before the person types a password. */
export const accountLinkDto = z.object({ email: z.string(), name: z.string(), expiresAt: z.string() });
export type AccountLinkDto = z.infer<typeof accountLinkDto>;

export const INVITATION_HOURS = 72;
export const PASSWORD_RESET_HOURS = 1;
