import { z } from 'zod';

// Every environment variable the server reads, parsed in one place.
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().optional(),
  PUBLIC_URL: z.string().url().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_FROM: z.string().default('Tightloop <no-reply@tightloop.example>'),
  STORAGE_DRIVER: z.enum(['local'], { message: 'Only local storage is available in this version' }).default('local'),
  STORAGE_DIR: z.string().default('.data/uploads'),
});

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
