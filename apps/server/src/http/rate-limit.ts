import { AppError } from './app-error';

/**
 * A sliding-window limit per key (an address) kept in memory, for public lookups that need no
 * account: past `limit` requests in `windowMs`, 429 with Retry-After. A restart forgets it, which
 * a lookup of 128-bit codes can afford.
 */
export function createRateLimiter(options: { limit: number; windowMs: number; now: () => Date }) {
  const seen = new Map<string, number[]>();
  return {
    take(key: string): void {
      const now = options.now().getTime();
      const recent = (seen.get(key) ?? []).filter((at) => at > now - options.windowMs);
      if (recent.length >= options.limit) {
        const retry = Math.ceil((recent[0]! + options.windowMs - now) / 1000);
        seen.set(key, recent);
        throw new AppError(
          429,
          'too_many_requests',
          `Too many checks from this address: wait ${retry} seconds and try again.`,
          undefined,
          { 'Retry-After': String(retry) },
        );
      }
      recent.push(now);
      seen.set(key, recent);
      if (seen.size > 10_000)
        for (const [other, times] of seen)
          if (times.every((at) => at <= now - options.windowMs)) seen.delete(other);
    },
  };
}
