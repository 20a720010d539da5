import cron from 'node-cron'
import { z } from 'zod'

const cronExpression = z.string().refine((v) => cron.validate(v), 'not a cron expression')

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
  /**
   * Behind a load balancer or reverse proxy: which proxies may name the client's address in
   * X-Forwarded-For, as Express's `trust proxy` takes it: a number of hops (1 for one balancer) or
   * a comma-separated list of addresses and subnets (`10.0.0.0/8`, `loopback`). Unset, nothing in
   * front is trusted: the address the rate limits key on is the connection's.
   */
  TRUST_PROXY: z
    .string()
    .trim()
    .regex(
      /^(\d{1,2}|[\w.:/,\s-]+)$/,
      'TRUST_PROXY is a number of hops or a list of addresses and subnets',
    )
    .refine((v) => !/^(true|false)$/i.test(v), 'TRUST_PROXY is a number of hops, not true/false')
    .transform((v) => (/^\d+$/.test(v) ? Number(v) : v))
    .optional(),
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
  /** Object storage for catch photos (an S3 endpoint); when unset, npm start runs the local stand-in. */
  S3_URL: z.url().optional(),
  S3_BUCKET: z.string().min(3).max(63).default('chopline-photos'),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  /** Port of the local S3 stand-in that npm start runs when S3_URL is unset. */
  S3_PORT: z.coerce.number().int().min(0).max(65535).default(4569),
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
  /**
   * The jobs' schedules, when not the usual (cron expressions, an optional seconds field first):
   * gauge readings every 15 minutes, weather hourly, briefs every five minutes.
   */
  INGEST_READINGS_CRON: cronExpression.optional(),
  INGEST_WEATHER_CRON: cronExpression.optional(),
  SEND_BRIEFS_CRON: cronExpression.optional(),
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

/** The photo store's settings from S3_*, or undefined when S3_URL is unset. */
export function s3Settings(env: Env) {
  if (!env.S3_URL) return undefined
  if (!env.S3_ACCESS_KEY_ID || !env.S3_SECRET_ACCESS_KEY)
    throw new Error('S3_URL needs S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY.')
  return {
    url: env.S3_URL,
    bucket: env.S3_BUCKET,
    region: env.S3_REGION,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
  }
}

/** The origin links in e-mail point at: APP_ORIGIN, or where the local server listens. */
export function publicOrigin(env: Env): string {
  return env.APP_ORIGIN ?? `http://${env.HOST}:${env.PORT}`
}

/**
 * The origins a state-changing request may come from: APP_ORIGIN, or where the local server
 * listens (by name and by loopback address when it listens on loopback), never the Host header a
 * request brings, which a rebinding page controls.
 */
export function allowedOrigins(env: Env): string[] {
  if (env.APP_ORIGIN) return [new URL(env.APP_ORIGIN).origin]
  const loopback = ['127.0.0.1', 'localhost', '::1', '[::1]'].includes(env.HOST)
  const hosts = loopback ? ['127.0.0.1', 'localhost', '[::1]'] : [env.HOST]
  return hosts.map((host) => `http://${host}:${env.PORT}`)
}

/** The jobs' schedules the environment changes (`startScheduler`'s second argument). */
export function jobSchedule(env: Env) {
  return {
    ingestReadings: env.INGEST_READINGS_CRON,
    ingestWeather: env.INGEST_WEATHER_CRON,
    sendBriefs: env.SEND_BRIEFS_CRON,
  }
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
