import { createServer } from 'vite'
import { serveLocal } from './local'

/** `npm run dev`: the API and Vite's dev server (with HMR) in one process on one port. */
await serveLocal(async () => {
  const vite = await createServer({ server: { middlewareMode: true }, appType: 'spa' })
  return { devMiddleware: vite.middlewares, close: () => vite.close() }
})
