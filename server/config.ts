import { z } from 'zod';

/**
 * Local stand-ins for the hosted services, on loopback and the project's own ports.
 * `scripts/services.ts` starts these; production overrides every one through the environment.
 *
 * The local services' addresses, every port moved by `offset`: `SPOOLWRIGHT_PORT_OFFSET`
 * (default 0) with `SPOOLWRIGHT_DATA_DIR` (default `.data`) runs a second, independent set of
 * local services on one machine (the crash test runs one).
 */
export function localServices(offset = 0) {
  return {
    postgres: { host: '127.0.0.1', port: 55432 + offset, user: 'spoolwright', password: 'spoolwright' },
    redis: { host: '127.0.0.1', port: 56379 + offset },
    smtp: { host: '127.0.0.1', port: 1025 + offset },
    mailViewer: { host: '127.0.0.1', port: 1080 + offset },
    s3: { host: '127.0.0.1', port: 4568 + offset, accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
  } as const;
}

export const PORT_OFFSET_MAX = 2000;
const portOffset = (() => {
  const raw = process.env.SPOOLWRIGHT_PORT_OFFSET;
  if (raw === undefined || raw === '') return 0;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0 || n > PORT_OFFSET_MAX) {
    throw new Error(`Invalid configuration:\n  SPOOLWRIGHT_PORT_OFFSET: a whole number from 0 to ${PORT_OFFSET_MAX} (got ${JSON.stringify(raw)})`);
  }
  return n;
})();

export const LOCAL = localServices(portOffset);

const isTest = process.env.NODE_ENV === 'test';
const suffix = isTest ? '_test' : '';
const pg = LOCAL.postgres;

const defaults = {
  DATABASE_URL: `postgres://${pg.user}:${pg.password}@${pg.host}:${pg.port}/spoolwright${suffix}`,
  // Tests use their own Redis database number so queues never mix with a running demo.
  REDIS_URL: `redis://${LOCAL.redis.host}:${LOCAL.redis.port}/${isTest ? 1 : 0}`,
  SMTP_URL: `smtp://${LOCAL.smtp.host}:${LOCAL.smtp.port}`,
  MAIL_VIEWER_URL: `http://${LOCAL.mailViewer.host}:${LOCAL.mailViewer.port}`,
  S3_ENDPOINT: `http://${LOCAL.s3.host}:${LOCAL.s3.port}`,
  S3_BUCKET: isTest ? 'spoolwright-test' : 'spoolwright',
};

const schema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  PUBLIC_URL: z.string().url().optional(),
  DATABASE_URL: z.string().url().default(defaults.DATABASE_URL),
  REDIS_URL: z.string().url().default(defaults.REDIS_URL),
  SMTP_URL: z.string().url().default(defaults.SMTP_URL),
  MAIL_FROM: z.string().default('Spoolwright <no-reply@spoolwright.test>'),
  /** Shown to the admin in local runs only; unset in production. */
  MAIL_VIEWER_URL: z.string().url().optional(),
  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().default('us-east-1'),
  S3_BUCKET: z.string().min(3).default(defaults.S3_BUCKET),
  S3_ACCESS_KEY_ID: z.string().optional(),
  S3_SECRET_ACCESS_KEY: z.string().optional(),
  S3_FORCE_PATH_STYLE: z
    .enum(['true', 'false'])
    .optional()
    .transform((v) => (v === undefined ? undefined : v === 'true')),
  SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters').optional(),
  /** Set when the app runs behind an HTTPS-terminating proxy: cookies become Secure. */
  TRUST_PROXY: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  /**
   * Where sessions live: postgres (default: the `session` table; the API keeps signing people in
   * while Redis is away) or redis (faster per request, but every signed-in request then needs Redis).
   */
  SESSION_STORE: z.enum(['postgres', 'redis']).default('postgres'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).optional(),
});

export type Config = ReturnType<typeof loadConfig>;

const DEV_SESSION_SECRET = 'spoolwright-local-development-secret';
/** What a production process must be told: the secrets and the real services' addresses. */
export const PRODUCTION_REQUIRED = ['SESSION_SECRET', 'DATABASE_URL', 'REDIS_URL', 'SMTP_URL', 'S3_BUCKET', 'PUBLIC_URL'] as const;

/** Reads and validates the environment once; refuses to start on a bad value, naming it. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env) {
  const parsed = schema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  const production = c.NODE_ENV === 'production';
  const usesLocalS3 = !c.S3_ENDPOINT || c.S3_ENDPOINT === defaults.S3_ENDPOINT;
  if (production) {
    // Production never falls back to the local stand-ins or the development secret.
    const missing = PRODUCTION_REQUIRED.filter((k) => !env[k]);
    if (missing.length) throw new Error(`Invalid configuration:\n${missing.map((k) => `  ${k}: required in production`).join('\n')}`);
    if (c.SESSION_SECRET === DEV_SESSION_SECRET) throw new Error('Invalid configuration:\n  SESSION_SECRET: choose your own secret, not the development one');
  }
  return {
    env: c.NODE_ENV,
    production,
    port: c.PORT,
    host: c.HOST,
    publicUrl: c.PUBLIC_URL ?? `http://${c.HOST}:${c.PORT}`,
    databaseUrl: c.DATABASE_URL,
    redisUrl: c.REDIS_URL,
    smtpUrl: c.SMTP_URL,
    mailFrom: c.MAIL_FROM,
    mailViewerUrl: c.MAIL_VIEWER_URL ?? (production ? undefined : defaults.MAIL_VIEWER_URL),
    s3: {
      endpoint: c.S3_ENDPOINT ?? (production ? undefined : defaults.S3_ENDPOINT),
      region: c.S3_REGION,
      bucket: c.S3_BUCKET,
      accessKeyId: c.S3_ACCESS_KEY_ID ?? (usesLocalS3 && !production ? LOCAL.s3.accessKeyId : undefined),
      secretAccessKey: c.S3_SECRET_ACCESS_KEY ?? (usesLocalS3 && !production ? LOCAL.s3.secretAccessKey : undefined),
      forcePathStyle: c.S3_FORCE_PATH_STYLE ?? usesLocalS3,
    },
    sessionSecret: c.SESSION_SECRET ?? DEV_SESSION_SECRET,
    trustProxy: c.TRUST_PROXY,
    sessionStore: c.SESSION_STORE,
    logLevel: c.LOG_LEVEL ?? (c.NODE_ENV === 'test' ? 'silent' : 'info'),
  };
}

let cached: Config | undefined;
export function config(): Config {
  cached ??= loadConfig();
  return cached;
}
