import pino, { type Logger } from 'pino';

export type { Logger };

/** The server's logger. Secrets are redacted wherever they might appear. */
export function createLogger(level: string, pretty: boolean): Logger {
  return pino({
    level,
    timestamp: pino.stdTimeFunctions.isoTime,
    redact: {
      paths: [
        'req.headers.cookie',
        'req.headers.authorization',
        'res.headers["set-cookie"]',
        '*.password',
        '*.currentPassword',
        '*.newPassword',
        '*.token',
      ],
      censor: '[redacted]',
    },
    ...(pretty ? { transport: { target: 'pino-pretty', options: { colorize: true } } } : {}),
  });
}
