// argon2id password hashing (OWASP's recommended parameters: m=19 MiB, t=2, p=1).
import { hash, verify } from "@node-rs/argon2";

const OPTIONS = { algorithm: 2 /* Algorithm.Argon2id (a const enum) */, memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

// A hash of a random secret, checked when the e-mail is unknown so both answers take as long.
let dummyHash: Promise<string> | undefined;

export async function verifyPassword(passwordHash: string | null, password: string): Promise<boolean> {
  if (!passwordHash) {
    dummyHash ??= hashPassword(crypto.randomUUID());
    await verify(await dummyHash, password).catch(() => false);
    return false;
  }
  return verify(passwordHash, password).catch(() => false);
}
