import type { UserDto } from '../../shared/schemas/account';
import type { users } from '../db/schema';

type UserRow = typeof users.$inferSelect;
type UserLike = Pick<UserRow, 'id' | 'email' | 'name' | 'role' | 'certificateNumber' | 'active' | 'createdAt'> &
  Partial<Pick<UserRow, 'certificateExpiresOn'>>;

export function toUserDto(u: UserLike): UserDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    certificateNumber: u.certificateNumber ?? null,
    certificateExpiresOn: u.certificateExpiresOn ?? null,
    active: Boolean(u.active),
    createdAt: new Date(u.createdAt).toISOString(),
  };
}
