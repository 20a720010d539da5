import type { PageCommit } from './ingest.repo'

type Waiter = { pages: PageCommit[]; done: (err?: unknown) => void }

/**
 * Group commit: pages that arrive while `lanes` commits are already running wait and then go
 * together in the next one, so many stations read at once share a statement and a transaction
 * instead of taking one each. A caller's promise settles when its own pages are committed (or the
 * shared commit fails), and a crash still leaves each page whole or absent.
 */
export function groupCommit(commit: (pages: PageCommit[]) => Promise<void>, lanes = 2) {
  let waiting: Waiter[] = []
  let running = 0

  async function lane() {
    running++
    while (waiting.length) {
      const batch = waiting
      waiting = []
      try {
        await commit(batch.flatMap((w) => w.pages))
        for (const w of batch) w.done()
      } catch (err) {
        for (const w of batch) w.done(err)
      }
    }
    running--
  }

  return (pages: PageCommit[]) =>
    new Promise<void>((resolve, reject) => {
      waiting.push({ pages, done: (err) => (err === undefined ? resolve() : reject(err)) })
      if (running < lanes) void lane()
    })
}
