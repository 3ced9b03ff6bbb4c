import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';

/** The RFC 8785 (JSON Canonicalization Scheme) form of a value: what is hashed is exactly this. */
export function canonicalJson(value: unknown): string {
  const text = canonicalize(value);
  if (text === undefined) throw new Error('this value has no JSON form');
  return text;
}

/** SHA-256 (hex) of a text's UTF-8 bytes. */
export function sha256Hex(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** SHA-256 (hex) of the canonical JSON of a value. */
export function canonicalSha256(value: unknown): string {
  return sha256Hex(canonicalJson(value));
}
