import { z } from 'zod'

/**
 * Environment, parsed once with zod. Every variable is listed in .env.example with a one-line comment.
 * Which SMTP relay or payments host to use is only a value here: no code branches on "is this a fake".
 */
const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('0.0.0.0'),
  PUBLIC_URL: z.string().url().default('http://localhost:3000'),
  DATABASE_PATH: z.string().default('./data/fillwright.sqlite'),
  /** empty = SQLite at DATABASE_PATH */
  DATABASE_URL: z.string().default(''),
  SESSION_SECRET: z.string().min(16).default('dev-only-session-secret-change-me'),
  TRUST_PROXY: z.string().default('loopback'),
  COOKIE_SECURE: z.enum(['auto', 'true', 'false']).default('auto'),
  DEMO_PASSWORD: z.string().min(8).default('fillwright-demo'),
  SEED_DEMO: z.enum(['true', 'false']).default('true'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  UPLOAD_DIR: z.string().default('./data/uploads'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
  SMTP_SECURE: z.enum(['true', 'false']).default('false'),
  SMTP_USER: z.string().default(''),
  SMTP_PASS: z.string().default(''),
  MAIL_FROM: z.string().default('Fillwright <no-reply@fillwright.test>'),
  FAKE_SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
  FAKE_SMTP_WEB_PORT: z.coerce.number().int().min(0).max(65535).default(2580),
  STRIPE_SECRET_KEY: z.string().default('sk_test_fillwright_local_fake'),
  /** empty string = the real payment service */
  STRIPE_API_HOST: z.string().default('127.0.0.1'),
  STRIPE_API_PORT: z.coerce.number().int().min(0).max(65535).default(12111),
  STRIPE_API_PROTOCOL: z.enum(['http', 'https']).default('http'),
  STRIPE_WEBHOOK_SECRET: z.string().default('whsec_fillwright_local_fake'),
  FAKE_PAYMENTS_PORT: z.coerce.number().int().min(0).max(65535).default(12111),
  START_FAKES: z.enum(['true', 'false']).default('true'),
  WEB_CONCURRENCY: z.coerce.number().int().min(1).max(64).default(1),
})

export type Env = z.infer<typeof EnvSchema>

export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = EnvSchema.safeParse(source)
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`)
    throw new Error(`Invalid environment:\n${lines.join('\n')}`)
  }
  return parsed.data
}
