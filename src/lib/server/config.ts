/**
 * The process environment, parsed once with zod. Imported by the web server, the worker,
 * the migration CLI and the tests, so every process agrees on where the services live.
 * Defaults match docker/services.sh (MariaDB 127.0.0.1:3307, Redis 127.0.0.1:6380).
 * Relative imports only: the worker loads this outside Vite.
 */
import { z } from 'zod';

const port = z.coerce.number().int().min(1).max(65535);

const schema = z.object({
  LOFTWISE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  DB_HOST: z.string().min(1).default('127.0.0.1'),
  DB_PORT: port.default(3307),
  DB_NAME: z.string().regex(/^[A-Za-z0-9_]+$/, 'letters, digits and _ only').optional(),
  DB_USER: z.string().min(1).default('loftwise'),
  DB_PASS: z.string().default('loftwise_pw'),
  DB_POOL_MAX: z.coerce.number().int().min(1).max(200).default(10),
  REDIS_HOST: z.string().min(1).default('127.0.0.1'),
  REDIS_PORT: port.default(6380),
  /** Prefix of every BullMQ key, so test runs never see development jobs. */
  QUEUE_PREFIX: z.string().regex(/^[A-Za-z0-9_-]+$/).optional(),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: port.default(2526),
  MAIL_FROM: z.string().default('Loftwise <no-reply@loftwise.invalid>'),
  /** Public URL of the web server, used in e-mailed links. */
  ORIGIN: z.string().url().default('http://127.0.0.1:3000'),
  SWEEP_CASE_CAP: z.coerce.number().int().min(1).default(2_000_000),
  LOG_LEVEL: z.enum(['silent', 'error', 'warn', 'info', 'debug']).default('info')
});

export type Config = z.infer<typeof schema> & { DB_NAME: string; QUEUE_PREFIX: string };

function parse(env: NodeJS.ProcessEnv): Config {
  const result = schema.safeParse(env);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  const c = result.data;
  const isTest = c.LOFTWISE_ENV === 'test';
  return {
    ...c,
    DB_NAME: c.DB_NAME ?? (isTest ? 'loftwise_test' : 'loftwise'),
    QUEUE_PREFIX: c.QUEUE_PREFIX ?? (isTest ? 'lw-test' : 'lw')
  };
}

export const config: Config = parse(process.env);
export const parseConfig = parse;
