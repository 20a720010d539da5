import { startFeed } from '../../server/fakes/feed/index'
import { BENCH_NOW, benchStations } from './bench-stations'

/** The fake feed in a process of its own, as a hosted feed would be: prints its URL, runs until killed. */
const feed = await startFeed({
  seed: 3,
  stations: benchStations(Number(process.argv[2] ?? 500)),
  now: () => BENCH_NOW,
  recordTruth: false,
})
console.log(feed.url)
for (const signal of ['SIGINT', 'SIGTERM'] as const)
  process.on(signal, () => void feed.close().then(() => process.exit(0)))
