import { hash, verify } from '@node-rs/argon2';

/**
 * Password hashing with argon2id at @node-rs/argon2's defaults (m = 19 MiB, t = 2, p = 1), the
 * minimum the OWASP Password Storage Cheat Sheet recommends for argon2id. The PHC string keeps
 * its own parameters, so raising them later still verifies old hashes.
 */
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

/** Whether `password` matches the stored hash; false (never a throw) for a malformed hash. */
export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

// A real hash of a random password, verified when the e-mail is unknown so that a wrong
// e-mail takes as long as a wrong password (no account discovery by timing).
let decoyHash: Promise<string> | undefined;
export async function verifyAgainstDecoy(password: string): Promise<false> {
  decoyHash ??= hash(`decoy-${Math.random()}-${Date.now()}`);
  await verifyPassword(await decoyHash, password);
  return false;
}
