import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';

/** Hashes a new password; bcryptjs adds a random salt per hash. */
export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}

const standInHashes = new Map<number, Promise<string>>();

/**
 * Compares a password with a stored hash. Without a hash (no such account, or an invitation not
 * yet accepted) it still runs one bcrypt comparison against a stand-in hash at the configured
 * cost, so the answer takes as long either way.
 */
export async function verifyPassword(
  password: string,
  hash: string | null,
  cost: number,
): Promise<boolean> {
  if (hash) return bcrypt.compare(password, hash);
  let standIn = standInHashes.get(cost);
  if (!standIn) {
    standIn = bcrypt.hash(randomBytes(16).toString('hex'), cost);
    standInHashes.set(cost, standIn);
  }
  await bcrypt.compare(password, await standIn);
  return false;
}
