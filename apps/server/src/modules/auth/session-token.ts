import { errors, jwtVerify, SignJWT } from 'jose';

const ISSUER = 'emberline';
const AUDIENCE = 'emberline-web';
const ALGORITHM = 'HS256';

export interface SessionClaims {
  userId: string;
  sessionId: string;
}

/** Signs the session cookie's token; `exp` is the session's absolute end. */
export async function signSessionToken(
  key: Uint8Array,
  claims: SessionClaims,
  expiresAt: Date,
): Promise<string> {
  return new SignJWT({ sid: claims.sessionId })
    .setProtectedHeader({ alg: ALGORITHM, typ: 'JWT' })
    .setSubject(claims.userId)
    .setIssuer(ISSUER)
    .setAudience(AUDIENCE)
    .setIssuedAt()
    .setExpirationTime(Math.floor(expiresAt.getTime() / 1000))
    .sign(key);
}

/**
 * Verifies a session token: HS256 only (so `alg: none` and every other algorithm fail), issuer and
 * audience checked, `exp` required. Returns null for any token that does not verify.
 */
export async function verifySessionToken(
  key: Uint8Array,
  token: string,
  now: Date,
): Promise<SessionClaims | null> {
  try {
    const { payload } = await jwtVerify(token, key, {
      algorithms: [ALGORITHM],
      issuer: ISSUER,
      audience: AUDIENCE,
      requiredClaims: ['exp', 'sub', 'sid'],
      currentDate: now,
    });
    if (typeof payload.sub !== 'string' || typeof payload.sid !== 'string') return null;
    return { userId: payload.sub, sessionId: payload.sid };
  } catch (error) {
    if (error instanceof errors.JOSEError || error instanceof TypeError) return null;
    throw error;
  }
}
