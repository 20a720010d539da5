import { createServer } from 'vite'
import { loadEnv } from '../env'
import { serve } from '../index'
import { createLogger } from '../logger'
import { prepareLocalStack } from './local'

/** `npm run dev`: the API and Vite's dev server (with HMR) in one process on one port. */
const env = loadEnv()
const logger = createLogger(env.LOG_LEVEL)
const stack = await prepareLocalStack(env)
const vite = await createServer({ server: { middlewareMode: true }, appType: 'spa' })
await serve({
  db: stack.db,
  logger,
  host: env.HOST,
  port: env.PORT,
  sessionSecret: stack.sessionSecret,
  secureCookies: false,
  devMiddleware: vite.middlewares,
  onClose: async () => {
    await vite.close()
    await stack.cluster?.stop()
  },
})
console.log(`Chopline (dev) at http://${env.HOST}:${env.PORT}`)
