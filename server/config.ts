import { z } from 'zod'

const flag = z
  .enum(['1', '0', 'true', 'false', 'yes', 'no', 'on', 'off'])
  .transform((v) => ['1', 'true', 'yes', 'on'].includes(v))

export const ConfigSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  DATA_DIR: z.string().default('./data'),
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
})
export type Config = z.infer<typeof ConfigSchema>

/** Parses the environment once; an invalid value stops the process with the field named. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  return ConfigSchema.parse(env)
}
