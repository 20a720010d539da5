import { Worker } from 'node:worker_threads'
import { badFile, unavailable } from '../../http/errors'
import type { OutlineCheckAnswer } from './outline-check.worker'

export type OutlineChecked = Extract<OutlineCheckAnswer, { ok: true }>

// The worker is TypeScript: it registers tsx's loader before importing it, under tsx or vitest alike.
const tsxApi = import.meta.resolve('tsx/esm/api')
const entry = new URL('./outline-check.worker.ts', import.meta.url).href
const bootstrap = `import(${JSON.stringify(tsxApi)}).then(({ register }) => { register(); return import(${JSON.stringify(entry)}) })`

const badGeojson = (message: string) => badFile('bad_geojson', message)

/**
 * Checks an uploaded outline (JSON, GeoJSON shape, `assertPlausibleShoreline`) in a worker thread
 * of its own, so a heavy file never holds up other requests: at most `concurrent` at once, each
 * stopped after `timeLimitMs` (a 503 that says so), the answer a 400 with the reason when the file
 * cannot be a lake.
 */
export function outlineChecker(opts: { timeLimitMs: number; concurrent?: number }) {
  const concurrent = opts.concurrent ?? 2
  let running = 0
  return async function checkOutline(text: string): Promise<OutlineChecked> {
    if (running >= concurrent)
      throw unavailable('busy', 'Other outlines are being checked. Try again in a minute.')
    running++
    try {
      const answer = await new Promise<OutlineCheckAnswer>((resolve, reject) => {
        const worker = new Worker(bootstrap, {
          eval: true,
          workerData: text,
          resourceLimits: { maxOldGenerationSizeMb: 512 },
        })
        const timer = setTimeout(() => {
          void worker.terminate()
          reject(
            unavailable(
              'outline_check_timeout',
              `Checking the outline took longer than ${Math.round(opts.timeLimitMs / 1000)} s. Simplify it, or try again later.`,
              { file: 'Checking this outline took too long.' },
            ),
          )
        }, opts.timeLimitMs)
        worker.once('message', (m: OutlineCheckAnswer) => {
          clearTimeout(timer)
          resolve(m)
        })
        worker.once('error', (err) => {
          clearTimeout(timer)
          reject(err)
        })
        worker.once('exit', () => {
          clearTimeout(timer)
          reject(new Error('The outline check stopped without an answer.'))
        })
      })
      if (!answer.ok) throw badGeojson(answer.message)
      return answer
    } finally {
      running--
    }
  }
}
export type CheckOutline = ReturnType<typeof outlineChecker>
