// The administrator's list of people: who may sign in, with which role.
import { z } from 'zod';
import { ROLES } from '../permissions';
import { emailSchema, passwordSchema, userDto } from './account';

export const MAX_NAME_LENGTH = 120;
export const MAX_CERTIFICATE_LENGTH = 64;

const nameSchema = z.string().trim().min(1, 'Enter a name').max(MAX_NAME_LENGTH, 'Name is too long');
const certificateSchema = z
  .string()
  .trim()
  .max(MAX_CERTIFICATE_LENGTH, 'Certificate number is too long')
  .transform((v) => (v === '' ? null : v))
  .nullable();

// The certificate's last valid day (YYYY-MM-DD); blank = not known.
const certificateExpirySchema = z.preprocess(
  (v) => (typeof v === 'string' && v.trim() === '' ? null : v),
  z.iso.date({ message: 'Use a date such as 2027-03-31' }).nullable(),
);

export const createUserSchema = z.object({
  email: emailSchema,
  name: nameSchema,
  role: z.enum(ROLES, { message: 'Choose a role' }),
  certificateNumber: certificateSchema.optional(),
  certificateExpiresOn: certificateExpirySchema.optional(),
  // Without a password the account waits for the person to set one (invitation).
  password: passwordSchema.optional(),
});
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    name: nameSchema.optional(),
    role: z.enum(ROLES).optional(),
    certificateNumber: certificateSchema.optional(),
    certificateExpiresOn: certificateExpirySchema.optional(),
    active: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const usersListDto = z.object({ users: z.array(userDto) });
export type UsersListDto = z.infer<typeof usersListDto>;
