import { z } from 'zod'

const Env = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  /** When unset, `npm start` runs a private cluster under .data/ and points this at it. */
  DATABASE_URL: z.url().optional(),
  /** HS256 key for session tokens; generated into .data/ in development when unset. */
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters').optional(),
  /** The public origin, e.g. https://chopline.example; state-changing requests must come from it. */
  APP_ORIGIN: z.url().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** The gauge-and-weather feed; when unset, npm start and npm run dev run the local fake. */
  FEED_URL: z.url().optional(),
  /** Port of the local fake feed that npm start runs when FEED_URL is unset. */
  FEED_PORT: z.coerce.number().int().min(0).max(65535).default(3100),
  /** Outgoing mail (smtp:// or smtps://); when unset, npm start and npm run dev run the local stand-in. */
  SMTP_URL: z
    .string()
    .regex(/^smtps?:\/\//, 'SMTP_URL must start with smtp:// or smtps://')
    .optional(),
  /** Port of the local SMTP stand-in that npm start runs when SMTP_URL is unset. */
  SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
  MAIL_FROM: z.string().min(3).default('Chopline <brief@chopline.example>'),
  /** Web Push (VAPID, RFC 8292) keys, base64url; generated into .data/ locally when unset. */
  VAPID_PUBLIC_KEY: z.string().min(40).optional(),
  VAPID_PRIVATE_KEY: z.string().min(20).optional(),
  /** Who runs the server, for push services: a mailto: or https: URL. */
  VAPID_SUBJECT: z
    .string()
    .regex(/^(mailto:|https:)/)
    .default('mailto:alerts@chopline.example'),
  /** Port of the local push stand-in that npm start runs. */
  PUSH_PORT: z.coerce.number().int().min(0).max(65535).default(3200),
  CHOPLINE_PG_PORT: z.coerce.number().int().min(1024).max(65535).default(54329),
})
export type Env = z.infer<typeof Env>

/** The only reader of process.env. */
export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = Env.safeParse(source)
  if (!parsed.success) {
    throw new Error(`Invalid environment:\n${z.prettifyError(parsed.error)}`)
  }
  return parsed.data
}

/** The origin links in e-mail point at: APP_ORIGIN, or where the local server listens. */
export function publicOrigin(env: Env): string {
  return env.APP_ORIGIN ?? `http://${env.HOST}:${env.PORT}`
}

/** The VAPID keys from the environment, or null when push is not set up there. */
export function vapidFromEnv(env: Env) {
  return env.VAPID_PUBLIC_KEY && env.VAPID_PRIVATE_KEY
    ? {
        publicKey: env.VAPID_PUBLIC_KEY,
        privateKey: env.VAPID_PRIVATE_KEY,
        subject: env.VAPID_SUBJECT,
      }
    : null
}
