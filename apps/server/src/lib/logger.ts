import pino, { type DestinationStream, type Logger } from 'pino';

export type { Logger };

/**
 * The server's logger. Secrets are redacted wherever they might appear. Lines go to stdout, or to
 * `destination` (the tests keep what the server logs there, to fail on an error nobody expected).
 */
export function createLogger(
  level: string,
  pretty: boolean,
  destination?: DestinationStream,
): Logger {
  const options: pino.LoggerOptions = {
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
  };
  return destination ? pino(options, destination) : pino(options);
}
