import argon2 from 'argon2';

// argon2id with the library's defaults (m = 64 MiB, t = 3, p = 4).
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

// Verifying against a throwaway hash keeps an unknown e-mail as slow as a wrong password.
let dummyHash: Promise<string> | null = null;
export async function burnPasswordCheck(password: string): Promise<void> {
  dummyHash ??= hashPassword('not-a-real-password-000');
  await verifyPassword(await dummyHash, password);
}
