import { createHash, randomBytes } from 'node:crypto';

/** A random identifier for a record: 16 bytes, base64url. */
export function newId(): string {
  return randomBytes(16).toString('base64url');
}

/** A secret for a link sent by e-mail: 32 bytes, base64url (43 characters). */
export function newSecretToken(): string {
  return randomBytes(32).toString('base64url');
}

export function sha256Hex(value: string): string {
  return createHash('sha256').update(value).digest('hex');
}
