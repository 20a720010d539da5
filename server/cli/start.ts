import { clientDir } from '../index'
import { serveLocal } from './local'

/** `npm start`: the whole app with demo data on a private PostgreSQL, serving the built client. */
await serveLocal(async () => ({ staticDir: clientDir }))
