/** `npm run bench -- NAME`: runs one benchmark; each prints a table and ends with one JSON line. */
const benches: Record<string, () => Promise<unknown>> = {
  brief: () => import('./brief'),
  dashboard: () => import('./dashboard'),
  exposure: () => import('./exposure'),
  ingest: () => import('./ingest'),
  journal: () => import('./journal'),
  outline: () => import('./outline'),
  watch: () => import('./watch'),
}

const name = process.argv[2]
const run = name ? benches[name] : undefined
if (!run) {
  console.error(`Usage: npm run bench -- <${Object.keys(benches).join('|')}>`)
  process.exit(2)
}
await run()

export {}
