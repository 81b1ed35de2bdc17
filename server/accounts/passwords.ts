import argon2 from 'argon2';

// argon2id with the library's defaults (64 MiB, 3 passes): OWASP's recommended family.
const OPTIONS = { type: argon2.argon2id } as const;

/** Hashes a password for storage. */
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, OPTIONS);
}

let dummyHash: Promise<string> | undefined;

/**
 * Checks a password against a stored hash. Without a hash (unknown e-mail) it still spends
 * the same effort, so timing does not tell which e-mail addresses have accounts.
 */
export async function verifyPassword(hash: string | undefined, password: string): Promise<boolean> {
  if (!hash) {
    dummyHash ??= argon2.hash('not-a-real-password', OPTIONS);
    await argon2.verify(await dummyHash, password);
    return false;
  }
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}
