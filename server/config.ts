import crypto from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { z } from 'zod';

const port = z.coerce.number().int().min(0).max(65535);

export type TrustProxy = false | number | string[];

/** Express's names for address ranges, besides addresses and subnets. */
const PROXY_RANGES = ['loopback', 'linklocal', 'uniquelocal'];

function isAddressOrSubnet(entry: string): boolean {
  const [address = '', prefix, ...rest] = entry.split('/');
  const family = net.isIP(address);
  if (family === 0 || rest.length > 0) return false;
  if (prefix === undefined) return true;
  return /^\d+$/.test(prefix) && Number(prefix) <= (family === 4 ? 32 : 128);
}

/**
 * TRUST_PROXY: unset, empty, `false` or 0 trusts no proxy; otherwise a number of hops, or a
 * comma-separated list of proxy addresses, subnets (CIDR) and the names loopback, linklocal and
 * uniquelocal. `true` is refused: it would let any client name its own address.
 */
const trustProxy = z
  .string()
  .optional()
  .transform((value, ctx): TrustProxy => {
    const text = value?.trim() ?? '';
    if (text === '' || text.toLowerCase() === 'false') return false;
    if (/^\d+$/.test(text)) return Number(text) || false;
    const entries = text.split(',').map((e) => e.trim().toLowerCase());
    const wrong = entries.filter((e) => !PROXY_RANGES.includes(e) && !isAddressOrSubnet(e));
    if (wrong.length === 0) return entries;
    ctx.addIssue({
      code: 'custom',
      message:
        `${wrong.map((e) => `"${e}"`).join(', ')} is not a proxy address, a subnet (such as 10.0.0.0/8), ` +
        'loopback, linklocal, uniquelocal or a number of hops; name the proxies in front of the app ' +
        '(trusting every sender would let any client choose its own address)',
    });
    return z.NEVER;
  });

const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: port.default(3000),
  APP_ORIGIN: z.url().optional(),
  DATABASE_URL: z.string().min(1, 'DATABASE_URL is required (postgres://…)'),
  DATABASE_POOL_SIZE: z.coerce.number().int().min(1).max(100).default(10),
  S3_ENDPOINT: z.url().optional(),
  S3_REGION: z.string().default('us-east-1'),
  S3_BUCKET: z.string().min(3).default('hilum'),
  S3_ACCESS_KEY_ID: z.string().min(1).default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default('S3RVER'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: port.default(2525),
  SMTP_SECURE: z.stringbool().default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().default('Hilum <no-reply@hilum.test>'),
  HILUM_DATA_DIR: z.string().default('.data'),
  OUTBOX_DIR: z.string().optional(),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters').optional(),
  STATIC_DIR: z.string().default('dist'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  TRUST_PROXY: trustProxy,
});

export type Env = z.infer<typeof EnvSchema>;

export interface Config {
  env: Env['NODE_ENV'];
  host: string;
  port: number;
  appOrigin: string;
  databaseUrl: string;
  databasePoolSize: number;
  storage: {
    endpoint: string | undefined;
    region: string;
    bucket: string;
    accessKeyId: string;
    secretAccessKey: string;
  };
  mail: {
    host: string;
    port: number;
    secure: boolean;
    user: string | undefined;
    password: string | undefined;
    from: string;
  };
  dataDir: string;
  outboxDir: string;
  sessionSecret: string;
  staticDir: string;
  logLevel: Env['LOG_LEVEL'];
  /**
   * The proxies whose X-Forwarded-For names the client (Express's `trust proxy`): false trusts
   * none, so the client is the socket's peer; a number trusts that many hops in front of the app.
   */
  trustProxy: TrustProxy;
}

/** Reads the signing secret from the data directory, creating it once, outside production. */
function developmentSecret(dataDir: string): string {
  const file = path.join(dataDir, 'session-secret');
  if (fs.existsSync(file)) return fs.readFileSync(file, 'utf8').trim();
  fs.mkdirSync(dataDir, { recursive: true });
  const secret = crypto.randomBytes(48).toString('base64url');
  fs.writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}

export class ConfigError extends Error {}

export function loadConfig(source: NodeJS.ProcessEnv = process.env): Config {
  const parsed = EnvSchema.safeParse(source);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
    throw new ConfigError(`invalid configuration: ${problems}`);
  }
  const env = parsed.data;
  if (env.NODE_ENV === 'production' && !env.SESSION_SECRET) {
    throw new ConfigError('invalid configuration: SESSION_SECRET is required in production');
  }
  const dataDir = path.resolve(env.HILUM_DATA_DIR);
  return {
    env: env.NODE_ENV,
    host: env.HOST,
    port: env.PORT,
    appOrigin: env.APP_ORIGIN ?? `http://127.0.0.1:${env.PORT}`,
    databaseUrl: env.DATABASE_URL,
    databasePoolSize: env.DATABASE_POOL_SIZE,
    storage: {
      endpoint: env.S3_ENDPOINT,
      region: env.S3_REGION,
      bucket: env.S3_BUCKET,
      accessKeyId: env.S3_ACCESS_KEY_ID,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    },
    mail: {
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE,
      user: env.SMTP_USER,
      password: env.SMTP_PASSWORD,
      from: env.MAIL_FROM,
    },
    dataDir,
    outboxDir: path.resolve(env.OUTBOX_DIR ?? path.join(dataDir, 'outbox')),
    sessionSecret: env.SESSION_SECRET ?? developmentSecret(dataDir),
    staticDir: path.resolve(env.STATIC_DIR),
    logLevel: env.LOG_LEVEL,
    trustProxy: env.TRUST_PROXY,
  };
}
