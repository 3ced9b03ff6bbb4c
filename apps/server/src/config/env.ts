import path from 'node:path';
import { z } from 'zod';

const booleanFlag = z
  .enum(['0', '1', 'true', 'false', 'yes', 'no'])
  .transform((value) => value === '1' || value === 'true' || value === 'yes');

const positiveInt = (label: string) =>
  z.coerce
    .number({ error: `${label} must be a number` })
    .int(`${label} must be a whole number`)
    .positive(`${label} must be above zero`);

const envSchema = z
  .object({
    NODE_ENV: z.enum(['development', 'production', 'test']).default('production'),
    PORT: z.coerce
      .number({ error: 'PORT must be a number' })
      .int('PORT must be a whole number')
      .min(0, 'PORT must be between 0 and 65535')
      .max(65535, 'PORT must be between 0 and 65535')
      .default(8080),
    HOST: z.string().min(1).default('0.0.0.0'),
    DATA_DIR: z.string().min(1).default('./data'),
    // Off unless asked: the demo accounts share a published password.
    DEMO: booleanFlag.default(false),
    DEMO_IMAGES: booleanFlag.default(true),
    SESSION_SECRET: z
      .string()
      .min(
        32,
        'SESSION_SECRET must be at least 32 characters; leave it unset to have one generated',
      )
      .optional(),
    PUBLIC_ORIGIN: z
      .string()
      .optional()
      .transform((value, context) => {
        if (!value) return [];
        const origins: string[] = [];
        for (const part of value
          .split(',')
          .map((item) => item.trim())
          .filter(Boolean)) {
          try {
            origins.push(new URL(part).origin);
          } catch {
            context.addIssue({
              code: 'custom',
              message: `PUBLIC_ORIGIN has "${part}", which is not a URL such as https://emberline.example.org`,
            });
          }
        }
        return origins;
      }),
    SESSION_IDLE_MINUTES: positiveInt('SESSION_IDLE_MINUTES').default(120),
    SESSION_ABSOLUTE_HOURS: positiveInt('SESSION_ABSOLUTE_HOURS').default(12),
    BCRYPT_COST: z.coerce
      .number()
      .int()
      .min(10, 'BCRYPT_COST must be at least 10')
      .max(15)
      .default(11),
    LOGIN_MAX_FAILURES: positiveInt('LOGIN_MAX_FAILURES').default(10),
    LOGIN_MAX_FAILURES_PER_IP: positiveInt('LOGIN_MAX_FAILURES_PER_IP').default(30),
    LOGIN_WINDOW_MINUTES: positiveInt('LOGIN_WINDOW_MINUTES').default(15),
    // Across addresses: this many failures in LOGIN_ACCOUNT_WINDOW_HOURS before each further try
    // from an address the owner does not use waits twice as long as the last (decision 009).
    LOGIN_MAX_FAILURES_PER_ACCOUNT: positiveInt('LOGIN_MAX_FAILURES_PER_ACCOUNT').default(20),
    LOGIN_ACCOUNT_WINDOW_HOURS: positiveInt('LOGIN_ACCOUNT_WINDOW_HOURS').default(24),
    TRUST_PROXY: z
      .string()
      .default('false')
      .transform((value): boolean | number | string => {
        if (value === 'false' || value === '0' || value === '') return false;
        if (value === 'true') return true;
        if (/^\d+$/.test(value)) return Number(value);
        return value;
      }),
    COOKIE_SECURE: z.enum(['auto', 'true', 'false']).default('auto'),
    JSON_LIMIT: z
      .string()
      .regex(/^\d+(kb|mb)$/, 'JSON_LIMIT must look like 100kb or 1mb')
      .default('1mb'),
    SMTP_HOST: z.string().optional(),
    SMTP_PORT: z.coerce.number().int().min(1).max(65535).optional(),
    SMTP_SECURE: booleanFlag.default(false),
    SMTP_USER: z.string().optional(),
    SMTP_PASSWORD: z.string().optional(),
    MAIL_FROM: z.string().default('Emberline <no-reply@emberline.invalid>'),
    // The key that seals the signature chain; keep it outside the data directory in production.
    RECORDS_KEY_FILE: z.string().min(1).optional(),
    MAIL_MAX_ATTACHMENTS_MB: positiveInt('MAIL_MAX_ATTACHMENTS_MB').max(200).default(25),
    LOG_LEVEL: z
      .enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'])
      .default('info'),
    // The installation's time zone: what "today" is for due dates (DESIGN §5.6).
    TZ: z
      .string()
      .default('UTC')
      .refine(
        (zone) => {
          try {
            new Intl.DateTimeFormat('en-GB', { timeZone: zone });
            return true;
          } catch {
            return false;
          }
        },
        { message: 'TZ must be a time zone such as UTC or Europe/Dublin' },
      ),
    // "Due soon": within this many days, cycles or hours of a due date.
    DUE_SOON_DAYS: positiveInt('DUE_SOON_DAYS').default(14),
    DUE_SOON_CYCLES: positiveInt('DUE_SOON_CYCLES').default(50),
    DUE_SOON_HOURS: positiveInt('DUE_SOON_HOURS').default(100),
    // The hour of the day (installation time zone, 0-23) planners get their daily digest.
    REMINDER_HOUR: z.coerce
      .number()
      .int()
      .min(0, { message: 'REMINDER_HOUR is an hour of the day, 0 to 23' })
      .max(23, { message: 'REMINDER_HOUR is an hour of the day, 0 to 23' })
      .default(7),
    // Where image originals and full renditions live (DESIGN §7): the data directory, or an
    // S3-compatible bucket under a prefix of the installation's own.
    STORAGE: z.enum(['local', 's3'], { error: 'STORAGE must be local or s3' }).default('local'),
    S3_ENDPOINT: z
      .url({ error: 'S3_ENDPOINT must be a URL such as https://s3.example.org' })
      .optional(),
    S3_REGION: z.string().min(1).default('us-east-1'),
    S3_BUCKET: z.string().min(3, 'S3_BUCKET must name a bucket').optional(),
    S3_PREFIX: z
      .string()
      .regex(
        /^([A-Za-z0-9._-]+\/)*$/,
        'S3_PREFIX must be empty or folder names ending in /, such as emberline/',
      )
      .default('emberline/'),
    S3_ACCESS_KEY_ID: z.string().min(1).optional(),
    S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
    S3_FORCE_PATH_STYLE: booleanFlag.default(false),
    // Objects under the prefix that no row names are moved to quarantine only when older than this.
    // 0 suits one server alone on its prefix: it sweeps before it listens, with no upload under way.
    S3_QUARANTINE_AFTER_HOURS: z.coerce
      .number({ error: 'S3_QUARANTINE_AFTER_HOURS must be a number' })
      .min(0, 'S3_QUARANTINE_AFTER_HOURS must be 0 or more')
      .default(24),
  })
  .superRefine((e, context) => {
    if (e.STORAGE !== 's3') return;
    if (!e.S3_BUCKET)
      context.addIssue({
        code: 'custom',
        path: ['S3_BUCKET'],
        message: 'S3_BUCKET is needed when STORAGE=s3',
      });
    if (Boolean(e.S3_ACCESS_KEY_ID) !== Boolean(e.S3_SECRET_ACCESS_KEY))
      context.addIssue({
        code: 'custom',
        path: ['S3_SECRET_ACCESS_KEY'],
        message:
          'S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY are set together, or both left to the SDK',
      });
  });

/** An S3-compatible bucket for image bytes. */
export interface S3StorageConfig {
  kind: 's3';
  /** Unset: the SDK's endpoint for the region. */
  endpoint: string | undefined;
  region: string;
  bucket: string;
  /** Every key the installation writes begins with it ('' or ending in '/'). */
  prefix: string;
  /** Unset: the SDK's own chain (environment, profile, instance role). */
  credentials: { accessKeyId: string; secretAccessKey: string } | undefined;
  forcePathStyle: boolean;
  quarantineAfterMs: number;
}

export type StorageConfig = { kind: 'local' } | S3StorageConfig;

export interface Config {
  nodeEnv: 'development' | 'production' | 'test';
  port: number;
  host: string;
  dataDir: string;
  demo: boolean;
  /** With the demo: a demo inspection with invented stills (off in most tests, for speed). */
  demoImages: boolean;
  sessionSecret: string | undefined;
  publicOrigins: string[];
  sessionIdleMs: number;
  sessionAbsoluteMs: number;
  bcryptCost: number;
  loginMaxFailures: number;
  loginMaxFailuresPerIp: number;
  loginMaxFailuresPerAccount: number;
  loginAccountWindowMs: number;
  loginWindowMs: number;
  trustProxy: boolean | number | string;
  cookieSecure: 'auto' | boolean;
  jsonLimit: string;
  smtp: { host: string; port: number; secure: boolean; user?: string; password?: string } | null;
  mailFrom: string;
  /** Where the records key is; null: one made inside the data directory (tampering undetectable). */
  recordsKeyFile: string | null;
  /** The most the attachments of one message may weigh, in bytes. */
  mailMaxAttachmentBytes: number;
  logLevel: string;
  /** The installation's time zone, in which a due date falls on a day. */
  timeZone: string;
  dueSoon: { days: number; cycles: number; hours: number };
  /** The hour of the day (in `timeZone`) of the planners' daily digest. */
  reminderHour: number;
  storage: StorageConfig;
}

export class ConfigError extends Error {
  override name = 'ConfigError';
}

/** Parses the environment once at start-up; throws a ConfigError naming every bad variable. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => {
      const name = issue.path.join('.');
      return `  ${name}: ${issue.message}`;
    });
    throw new ConfigError(
      `Emberline cannot start: the environment is not valid.\n${lines.join('\n')}`,
    );
  }
  const e = parsed.data;
  return {
    nodeEnv: e.NODE_ENV,
    port: e.PORT,
    host: e.HOST,
    dataDir: path.resolve(e.DATA_DIR),
    demo: e.DEMO,
    demoImages: e.DEMO_IMAGES,
    sessionSecret: e.SESSION_SECRET,
    publicOrigins: e.PUBLIC_ORIGIN,
    sessionIdleMs: e.SESSION_IDLE_MINUTES * 60_000,
    sessionAbsoluteMs: e.SESSION_ABSOLUTE_HOURS * 3_600_000,
    bcryptCost: e.BCRYPT_COST,
    loginMaxFailures: e.LOGIN_MAX_FAILURES,
    loginMaxFailuresPerIp: e.LOGIN_MAX_FAILURES_PER_IP,
    loginMaxFailuresPerAccount: e.LOGIN_MAX_FAILURES_PER_ACCOUNT,
    loginAccountWindowMs: e.LOGIN_ACCOUNT_WINDOW_HOURS * 3_600_000,
    loginWindowMs: e.LOGIN_WINDOW_MINUTES * 60_000,
    trustProxy: e.TRUST_PROXY,
    cookieSecure: e.COOKIE_SECURE === 'auto' ? 'auto' : e.COOKIE_SECURE === 'true',
    jsonLimit: e.JSON_LIMIT,
    smtp: e.SMTP_HOST
      ? {
          host: e.SMTP_HOST,
          port: e.SMTP_PORT ?? (e.SMTP_SECURE ? 465 : 587),
          secure: e.SMTP_SECURE,
          user: e.SMTP_USER,
          password: e.SMTP_PASSWORD,
        }
      : null,
    mailFrom: e.MAIL_FROM,
    mailMaxAttachmentBytes: e.MAIL_MAX_ATTACHMENTS_MB * 1024 * 1024,
    recordsKeyFile: e.RECORDS_KEY_FILE ? path.resolve(e.RECORDS_KEY_FILE) : null,
    logLevel: e.LOG_LEVEL,
    timeZone: e.TZ,
    dueSoon: { days: e.DUE_SOON_DAYS, cycles: e.DUE_SOON_CYCLES, hours: e.DUE_SOON_HOURS },
    reminderHour: e.REMINDER_HOUR,
    storage:
      e.STORAGE === 's3'
        ? {
            kind: 's3',
            endpoint: e.S3_ENDPOINT,
            region: e.S3_REGION,
            bucket: e.S3_BUCKET!,
            prefix: e.S3_PREFIX,
            credentials:
              e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY
                ? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY }
                : undefined,
            forcePathStyle: e.S3_FORCE_PATH_STYLE,
            quarantineAfterMs: e.S3_QUARANTINE_AFTER_HOURS * 3_600_000,
          }
        : { kind: 'local' },
  };
}
