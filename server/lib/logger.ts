import pino from 'pino';

export function createLogger(level: string) {
  return pino({ level, base: undefined, redact: ['req.headers.cookie', 'password'] });
}
export type Logger = ReturnType<typeof createLogger>;
