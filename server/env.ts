import { z } from 'zod';

// Every environment variable the server reads, parsed in one place.
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  // The address to listen on. Loopback by default, so a laptop running `npm start` is not reachable from its network;
  // a server behind a load balancer sets 0.0.0.0 (or ::), see docs/security.md.
  HOST: z.string().min(1).default('127.0.0.1'),
  // Which proxies may speak for the client through X-Forwarded-For/-Proto: nothing by default; a hop count ("1") or
  // Express's list of addresses, subnets and names ("loopback", "10.0.0.0/8, 10.1.2.3").
  TRUST_PROXY: z
    .string()
    .trim()
    .default('')
    .refine((v) => !/^(true|all|\*)$/i.test(v), {
      message:
        'Name the proxies (addresses, subnets or a hop count); trusting every sender makes X-Forwarded-For spoofable',
    })
    .transform(parseTrustProxy),
  // Session lifetimes (decision record 008): absolute, idle for office roles, idle for technicians' phones.
  SESSION_ABSOLUTE_DAYS: z.coerce.number().positive().max(365).default(30),
  SESSION_IDLE_HOURS: z.coerce
    .number()
    .positive()
    .max(24 * 365)
    .default(12),
  SESSION_IDLE_HOURS_TECHNICIAN: z.coerce
    .number()
    .positive()
    .max(24 * 365)
    .default(72),
  DATABASE_URL: z.string().optional(),
  PUBLIC_URL: z.string().url().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_FROM: z.string().default('Tightloop <no-reply@tightloop.example>'),
  // Uploads: local disk (the default) or S3-compatible object storage, which several API processes can share.
  STORAGE_DRIVER: z.enum(['local', 's3']).default('local'),
  STORAGE_DIR: z.string().default('.data/uploads'),
  S3_BUCKET: z.string().optional(),
  // Empty for AWS itself; the address of another S3-compatible service (which usually also wants path-style).
  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().default('us-east-1'),
  S3_FORCE_PATH_STYLE: z
    .enum(['true', 'false', ''])
    .default('')
    .transform((v) => v === 'true'),
  // Without these the AWS SDK's own chain applies (instance role, AWS_* variables, profile).
  S3_ACCESS_KEY_ID: z.string().optional(),
  S3_SECRET_ACCESS_KEY: z.string().optional(),
  S3_PREFIX: z.string().default(''),
  // The development mailbox (every invitation and reset link) answers loopback only unless this is "true".
  MAILBOX_FROM_ANY_ADDRESS: z
    .enum(['true', 'false', ''])
    .default('')
    .transform((v) => v === 'true'),
});

/** Express's `trust proxy` value: false (trust nothing), a hop count, or a list of addresses/subnets/names. */
export type TrustProxy = false | number | string;

function parseTrustProxy(v: string): TrustProxy {
  if (v === '' || /^(false|none|0)$/i.test(v)) return false;
  if (/^\d+$/.test(v)) return Number(v);
  return v;
}

export type Env = z.infer<typeof envSchema>;

export function readEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid environment:\n${lines}`);
  }
  return parsed.data;
}

export function publicUrl(env: Env): string {
  return (env.PUBLIC_URL ?? `http://localhost:${env.PORT}`).replace(/\/$/, '');
}

const LOOPBACK_HOSTS = ['127.0.0.1', 'localhost', '::1'];

/**
 * Whether mail goes to the local fake SMTP server (`npm start`, `npm run dev`, tests): SMTP on loopback without a
 * login, outside production. Only then is there a development mailbox to read.
 */
export function mailGoesToFakeSmtp(env: Env): boolean {
  return env.NODE_ENV !== 'production' && LOOPBACK_HOSTS.includes(env.SMTP_HOST) && !env.SMTP_USER;
}
