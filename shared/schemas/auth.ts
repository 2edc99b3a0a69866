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
  active: z.boolean(),
  createdAt: z.string(),
});
export type UserDto = z.infer<typeof userDto>;

export const meDto = z.object({ user: userDto });
export type MeDto = z.infer<typeof meDto>;
