import { startMailServer } from '../../server/fakes/mail/index'

/** The SMTP stand-in in a process of its own, as a hosted provider would be: prints its URL, runs until killed. */
const smtp = await startMailServer({ keep: 20 })
console.log(smtp.url)
for (const signal of ['SIGINT', 'SIGTERM'] as const)
  process.on(signal, () => void smtp.close().then(() => process.exit(0)))
