import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';

/** Hashes a new password; bcryptjs adds a random salt per hash. */
export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}

let standInHash: Promise<string> | null = null;

/**
 * Compares a password with a stored hash. Without a hash (no such account, or an invitation not
 * yet accepted) it still runs one bcrypt comparison, so the answer takes as long either way.
 */
export async function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  if (hash) return bcrypt.compare(password, hash);
  standInHash ??= bcrypt.hash(randomBytes(16).toString('hex'), 10);
  await bcrypt.compare(password, await standInHash);
  return false;
}
