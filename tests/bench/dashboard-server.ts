import type { AddressInfo } from 'node:net'
import { createDb } from '../../server/db/index'
import { clientDir, serve } from '../../server/index'
import { createLogger } from '../../server/logger'
import { smtpMailer } from '../../server/features/mail/mailer'

/** The app as `npm start` serves it, in a process of its own: prints its URL, runs until killed. */
const logger = createLogger('warn')
const server = await serve({
  db: createDb(process.argv[2]!, { log: logger }),
  logger,
  host: '127.0.0.1',
  port: 0,
  sessionSecret: 'bench-secret-that-is-long-enough-for-hs256-keys',
  secureCookies: false,
  staticDir: clientDir,
  mail: {
    mailer: smtpMailer('smtp://127.0.0.1:9', 'bench@chopline.example'),
    origin: 'http://127.0.0.1',
  },
})
console.log(`http://127.0.0.1:${(server.address() as AddressInfo).port}`)
