import { hash, verify } from '@node-rs/argon2';

// argon2id with the library's defaults (19 MiB, 2 passes): OWASP's minimum recommendation.
export const hashPassword = (password: string) => hash(password);

// A hash to check against when the account does not exist, so the answer takes as long.
let dummyHash: Promise<string> | undefined;

export async function verifyPassword(passwordHash: string | null | undefined, password: string): Promise<boolean> {
  if (!passwordHash) {
    dummyHash ??= hash('not-a-real-password-at-all');
    await verify(await dummyHash, password).catch(() => false);
    return false;
  }
  return verify(passwordHash, password).catch(() => false);
}
