import type { Request, Response } from 'express';
import { AppError } from './app-error';
import { optionalPrincipalOf } from './principal';

/**
 * How many requests of one kind an address, and a signed-in person wherever they are, may make in
 * a sliding window. Past it: 429 with Retry-After, before the request's body is read or checked.
 * The counts are kept in memory; a restart forgets them, which these limits can afford (the
 * password-check limits, which cannot, are kept in SQLite: modules/auth/password-check.ts).
 */
export interface RequestLimit {
  /** What is counted, for the message: "report checks", "uploads", "calculations". */
  what: string;
  perAddress: number;
  perUser: number;
  windowMs: number;
}

export const requestLimits = {
  // The public report check: 128-bit codes, so the limit is against load rather than guessing.
  verification: { what: 'report checks', perAddress: 30, perUser: 30, windowMs: 60_000 },
  // One still per request (the client's queue): an inspection's 300 stills fit four times over in
  // ten minutes, and a runaway client or script stops long before the disk does.
  upload: { what: 'uploads', perAddress: 2400, perUser: 1200, windowMs: 600_000 },
  // The annotator measures and judges in the browser; these are for integrations and checks. Two
  // a second each: the largest allowed takes about 30 ms of the one JavaScript thread, so that four
  // people flooding them leave it free most of the time (tests/timing/calculation-flood.test.ts).
  calculation: { what: 'calculations', perAddress: 20, perUser: 10, windowMs: 5_000 },
} satisfies Record<string, RequestLimit>;

/** The times of the requests of one key inside the window, oldest first. */
class Window {
  private times: number[] = [];
  private start = 0;

  /** Drops what fell out of the window; how many are left. */
  count(now: number, windowMs: number): number {
    while (this.start < this.times.length && this.times[this.start]! <= now - windowMs)
      this.start += 1;
    if (this.start > 1024 && this.start * 2 > this.times.length) {
      this.times = this.times.slice(this.start);
      this.start = 0;
    }
    return this.times.length - this.start;
  }

  oldest(): number {
    return this.times[this.start]!;
  }

  add(now: number): void {
    this.times.push(now);
  }
}

/** A sliding-window count per key. */
export function createRateLimiter(options: { limit: number; windowMs: number }) {
  const windows = new Map<string, Window>();
  return {
    /** Seconds to wait when `key` has met its limit, or null after counting this request. */
    take(key: string, now: number): number | null {
      let window = windows.get(key);
      if (!window) {
        window = new Window();
        windows.set(key, window);
      }
      if (window.count(now, options.windowMs) >= options.limit)
        return Math.max(1, Math.ceil((window.oldest() + options.windowMs - now) / 1000));
      window.add(now);
      if (windows.size > 10_000)
        for (const [other, kept] of windows)
          if (kept.count(now, options.windowMs) === 0) windows.delete(other);
      return null;
    },
  };
}

/**
 * The limiter of one kind of request for one app: per address, and per person when signed in.
 * Every route given the same limiter shares its counts.
 */
export function createRequestLimiter(limit: RequestLimit, now: () => Date) {
  const byAddress = createRateLimiter({ limit: limit.perAddress, windowMs: limit.windowMs });
  const byUser = createRateLimiter({ limit: limit.perUser, windowMs: limit.windowMs });
  return (req: Request, res: Response): void => {
    const at = now().getTime();
    const userId = optionalPrincipalOf(res)?.user.id;
    const userWait = userId ? byUser.take(userId, at) : null;
    const wait = userWait ?? byAddress.take(req.ip ?? req.socket.remoteAddress ?? 'unknown', at);
    if (wait === null) return;
    req.log.warn(
      { userId: userId ?? null, ip: req.ip, requestId: req.id, what: limit.what },
      'rate limit met',
    );
    const from = userWait !== null ? 'from your account' : 'from this address';
    throw new AppError(
      429,
      'too_many_requests',
      `Too many ${limit.what} ${from}: wait ${wait} second${wait === 1 ? '' : 's'} and try again.`,
      undefined,
      { 'Retry-After': String(wait) },
    );
  };
}

export type RequestLimiter = ReturnType<typeof createRequestLimiter>;
