import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadConfig } from './env';

describe('loadConfig', () => {
  it('defaults to port 8080, ./data, no demo scenario and a 2 h idle / 12 h absolute session', () => {
    const config = loadConfig({});
    expect(config.port).toBe(8080);
    expect(config.dataDir).toBe(path.resolve('./data'));
    expect(config.demo).toBe(false);
    expect(config.sessionIdleMs).toBe(2 * 3_600_000);
    expect(config.sessionAbsoluteMs).toBe(12 * 3_600_000);
    expect(config.smtp).toBeNull();
    expect(config.trustProxy).toBe(false);
  });

  it('reads DEMO=1, DEMO=0 and a real SMTP relay', () => {
    expect(loadConfig({ DEMO: '1' }).demo).toBe(true);
    const config = loadConfig({ DEMO: '0', SMTP_HOST: 'mail.example.org', SMTP_SECURE: 'true' });
    expect(config.demo).toBe(false);
    expect(config.smtp).toMatchObject({ host: 'mail.example.org', port: 465, secure: true });
  });

  it('fails fast naming every bad variable in words an operator understands', () => {
    expect(() =>
      loadConfig({ PORT: 'eighty', SESSION_SECRET: 'short', BCRYPT_COST: '4' }),
    ).toThrowError(
      /PORT: PORT must be a number[\s\S]*SESSION_SECRET: SESSION_SECRET must be at least 32 characters[\s\S]*BCRYPT_COST/,
    );
    expect(() => loadConfig({ PUBLIC_ORIGIN: 'not a url' })).toThrowError(
      /PUBLIC_ORIGIN has "not a url"/,
    );
  });
});
