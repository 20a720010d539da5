import type { AddressInfo } from 'node:net'
import { createFeed, type FeedOptions } from './app'

export type {
  FeedStation,
  FeedTruth,
  ScenarioChoice,
  ScenarioState,
  ServedObservation,
} from './app'
export { SCENARIOS, SCENARIO_NAMES, scenarioClock, type ScenarioName } from './scenarios'

/** Starts the fake gauge-and-weather feed on 127.0.0.1; port 0 picks a free one (tests). */
export async function startFeed(opts: FeedOptions, port = 0) {
  const feed = createFeed(opts)
  const server = feed.app.listen(port, '127.0.0.1')
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve)
    server.once('error', reject)
  })
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  return {
    url,
    controls: feed.controls,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections()
        server.close(() => resolve())
      }),
  }
}
export type RunningFeed = Awaited<ReturnType<typeof startFeed>>
