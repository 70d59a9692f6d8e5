import { z } from 'zod'

/** OWASP ASVS 2.4.4: bcrypt with a work factor of at least 13. */
export const MIN_BCRYPT_COST = 13

const flag = z
  .enum(['1', '0', 'true', 'false', 'yes', 'no', 'on', 'off'])
  .transform((v) => ['1', 'true', 'yes', 'on'].includes(v))

// Raising the work factor is always allowed; only the test runner may lower it, to spare a few hundred ms per hash.
const BcryptSchema = z.object({
  NODE_ENV: z.string().optional(),
  BCRYPT_COST: z.coerce.number().int().min(4).max(31).default(MIN_BCRYPT_COST),
})
const costAllowed = (c: z.infer<typeof BcryptSchema>) => c.BCRYPT_COST >= MIN_BCRYPT_COST || c.NODE_ENV === 'test'
const costRule = { path: ['BCRYPT_COST'], message: `BCRYPT_COST below ${MIN_BCRYPT_COST} is allowed only when NODE_ENV=test` }

export const ConfigSchema = z
  .object({
    PORT: z.coerce.number().int().min(0).max(65535).default(3000),
    HOST: z.string().default('127.0.0.1'),
    DATA_DIR: z.string().default('./data'),
    /** A `postgres://` URL selects PostgreSQL; without it the database is the SQLite file in DATA_DIR. */
    DATABASE_URL: z
      .string()
      .regex(/^postgres(?:ql)?:\/\//, 'DATABASE_URL must be a postgres:// or postgresql:// URL')
      .optional(),
    /** Folder for exam photos; every app server mounts the same one. Default: DATA_DIR/attachments. */
    UPLOADS_DIR: z.string().min(1).optional(),
    JWT_SECRET: z.string().min(64, 'JWT_SECRET must be at least 64 characters').optional(),
    DEMO: flag.default(true),
    COOKIE_SECURE: flag.default(true),
    SMTP_HOST: z.string().default('127.0.0.1'),
    SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
    SMTP_FROM: z.string().default('Plumbline <no-reply@plumbline.test>'),
    SMTP_USER: z.string().optional(),
    SMTP_PASS: z.string().optional(),
    /** Where users reach the app; links in e-mails are built on it. */
    PUBLIC_URL: z.url().optional(),
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
    /** Milliseconds that requests in flight get to finish after SIGTERM before their connections are cut. */
    SHUTDOWN_GRACE_MS: z.coerce.number().int().min(0).max(600_000).default(10_000),
    ...BcryptSchema.shape,
  })
  .refine(costAllowed, costRule)
export type Config = z.infer<typeof ConfigSchema>

/** Parses the environment once; an invalid value stops the process with the field named. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  return ConfigSchema.parse(env)
}

/** The bcrypt work factor, under the same rule as in `loadConfig`: 13 unless raised, or lowered by the test runner. */
export function bcryptCost(env: NodeJS.ProcessEnv = process.env): number {
  return BcryptSchema.refine(costAllowed, costRule).parse(env).BCRYPT_COST
}
