import "server-only";
import { hash, verify } from "@node-rs/argon2";

// argon2id with the parameters OWASP's Password Storage Cheat Sheet lists first
// (m = 19 MiB, t = 2, p = 1). Algorithm 2 is argon2id in @node-rs/argon2.
const OPTIONS = { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

// Verifying against a fixed hash when the e-mail is unknown keeps the answer's timing
// the same for known and unknown addresses.
let dummyHash: Promise<string> | undefined;
export async function burnPasswordCheck(password: string): Promise<void> {
  dummyHash ??= hashPassword("grainline-timing-equaliser");
  await verifyPassword(await dummyHash, password);
}
