import { spawn } from 'node:child_process'
import { once } from 'node:events'
import { readFileSync, rmSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { gzipSync } from 'node:zlib'
import autocannon from 'autocannon'
import * as chromeLauncher from 'chrome-launcher'
import { eq } from 'drizzle-orm'
import lighthouse from 'lighthouse'
import { computeMedianRun, filterToValidRuns } from 'lighthouse/core/lib/median-run.js'
import { pino } from 'pino'
import { build } from 'vite'
import { localDate } from '../../shared/time'
import { startCluster } from '../../server/db/cluster'
import { createDb } from '../../server/db/index'
import { migrateDb } from '../../server/db/migrate'
import { lakes } from '../../server/db/schema/index'
import { DEMO_PASSWORD, seedDemo } from '../../server/db/seed/index'
import { DEMO_FEED_SEED, DEMO_STATIONS } from '../../server/db/seed/demo-stations'
import { startFeed } from '../../server/fakes/feed/index'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { backfillReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import { clientDir } from '../../server/index'
import { CHROMIUM_ARGS } from '../helpers/browser'

/**
 * The dashboard served from the cache: autocannon (50 connections, 10 s, asking as a browser does)
 * against the Lake read and the Day plan and, in the same run, against /api/me (the session check
 * and a tiny JSON body) as the baseline; the JavaScript the Lake read loads before it is usable;
 * Lighthouse on that page.
 */
const SLUG = 'quillmere'
/** `npm run bench -- dashboard --no-lighthouse`: the API load only, for quick A/B runs (never a pass). */
const LIGHTHOUSE = !process.argv.includes('--no-lighthouse')
/** Mobile Lighthouse runs; Lighthouse's median run of them is reported. */
const LIGHTHOUSE_RUNS = 5
/** Lighthouse's own desktop preset: no CPU slowdown, a fast link. */
const DESKTOP = {
  extends: 'lighthouse:default',
  settings: {
    formFactor: 'desktop' as const,
    screenEmulation: { mobile: false, width: 1350, height: 940, deviceScaleFactor: 1 },
    throttling: { rttMs: 40, throughputKbps: 10240, cpuSlowdownMultiplier: 1 },
  },
}
const dataDir = fileURLToPath(new URL('../../.tmp/pg-bench-dashboard', import.meta.url))

await build({ logLevel: 'warn' })
const cluster = await startCluster({
  dataDir,
  port: 54393,
  user: 'bench',
  password: 'bench',
  database: 'bench',
  durable: false,
})
const db = createDb(cluster.url(), { max: 4 })
const stop: (() => Promise<unknown> | unknown)[] = []
try {
  await migrateDb(db)
  await seedDemo(db)
  const feed = await startFeed({ seed: DEMO_FEED_SEED, stations: DEMO_STATIONS })
  const deps = { db, feedUrl: feed.url, log: pino({ level: 'silent' }) }
  const [lake] = await db.select().from(lakes).where(eq(lakes.slug, SLUG))
  await backfillReadings(deps, lake!.id, 30)
  await ingestWeather(deps)
  await conditionsFor(db).refreshAll()
  await feed.close()

  const server = spawn(
    process.execPath,
    [
      '--import',
      'tsx',
      fileURLToPath(new URL('./dashboard-server.ts', import.meta.url)),
      cluster.url(),
    ],
    {
      stdio: ['ignore', 'pipe', 'inherit'],
    },
  )
  // Its pool is ended before the database stops: it shuts down on SIGTERM, then exits.
  stop.push(async () => {
    if (server.exitCode !== null || server.signalCode !== null) return
    const exited = once(server, 'exit')
    server.kill()
    await exited
  })
  const base = ((await once(server.stdout!, 'data')) as [Buffer])[0].toString().trim()
  const rssMb = () =>
    Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${server.pid}/status`, 'utf8'))![1]) / 1024

  // Sign in as the demo angler and save three banks, as a user of the dashboard would.
  const signin = await fetch(`${base}/api/auth/signin`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'angler@chopline.test', password: DEMO_PASSWORD }),
  })
  const cookie = signin.headers.getSetCookie()[0]!.split(';')[0]!
  const ring = lake!.shoreline.type === 'Polygon' ? lake!.shoreline.coordinates[0]! : []
  for (const [i, at] of [40, 200, 420].entries()) {
    const res = await fetch(`${base}/api/lakes/${SLUG}/banks`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', cookie },
      body: JSON.stringify({
        name: `Bench bank ${i + 1}`,
        points: [ring[at], ring[at + 3]],
        cover: ['rock', 'wood'],
        depthM: 3,
      }),
    })
    if (res.status !== 201) throw new Error(`bank ${i + 1}: ${res.status} ${await res.text()}`)
  }

  const today = localDate(new Date(), lake!.timeZone)
  const routes = {
    'baseline GET /api/me': '/api/me',
    'GET /api/lakes/:slug/read': `/api/lakes/${SLUG}/read`,
    'GET /api/lakes/:slug/plan/:date': `/api/lakes/${SLUG}/plan/${today}`,
  }
  // Asked as the signed-in angler's browser asks: with the session cookie, accepting gzip.
  const headers = { cookie, 'accept-encoding': 'gzip, deflate, br' }
  const load = (path: string, duration: number) =>
    autocannon({ url: base + path, connections: 50, duration, headers })
  // Warm up at the measured load, so the JIT has settled and the heap has grown to its working
  // size before the server's memory is first read.
  for (const path of Object.values(routes)) await load(path, 2)
  const rssBefore = rssMb()
  const results: Record<string, { rps: number; p99: number; errors: number; bytes: number }> = {}
  for (const [name, path] of Object.entries(routes)) {
    const r = await load(path, 10)
    results[name] = {
      rps: r.requests.average,
      p99: r.latency.p99,
      errors: r.errors + r.non2xx,
      bytes: r.throughput.total / r.requests.total,
    }
  }
  const rssAfter = rssMb()

  // What the Lake read loads before it is usable: the page's classic scripts, and the entry (which
  // holds the Lake read) with its static imports, not the chunks it loads later (map, charts).
  type Chunk = { file: string; imports?: string[]; css?: string[] }
  const manifest = JSON.parse(readFileSync(`${clientDir}/.vite/manifest.json`, 'utf8')) as Record<
    string,
    Chunk
  >
  const files = new Set<string>()
  const walk = (key: string) => {
    const chunk = manifest[key]!
    if (files.has(chunk.file)) return
    files.add(chunk.file)
    for (const i of chunk.imports ?? []) walk(i)
  }
  walk('index.html')
  const page = readFileSync(`${clientDir}/index.html`, 'utf8')
  for (const [, src] of page.matchAll(/<script src="\/([^"]+)"/g)) files.add(src!)
  const jsGzipKb =
    [...files].reduce((n, f) => n + gzipSync(readFileSync(`${clientDir}/${f}`)).length, 0) / 1024

  // Lighthouse on the signed-in Lake read.
  const lh = LIGHTHOUSE ? await lighthouseScores(base, cookie, stop) : null
  const performanceScore = lh?.performance ?? 0
  const accessibilityScore = lh?.accessibility ?? 0
  const desktopPerformance = lh?.desktop ?? 0
  if (lh) console.table(lh.metrics)

  const baseline = results['baseline GET /api/me']!
  const read = results['GET /api/lakes/:slug/read']!
  const plan = results['GET /api/lakes/:slug/plan/:date']!
  console.table(
    Object.fromEntries(
      Object.entries(results).map(([name, r]) => [
        name,
        {
          'req/s': Math.round(r.rps),
          'p99 (ms)': r.p99,
          errors: r.errors,
          'vs baseline': (r.rps / baseline.rps).toFixed(2),
          'bytes/answer': Math.round(r.bytes),
        },
      ]),
    ),
  )
  console.table({
    'server RSS before (MB)': Math.round(rssBefore),
    'server RSS after (MB)': Math.round(rssAfter),
    'Lake read JS before usable (kB gzip)': Number(jsGzipKb.toFixed(1)),
    [`Lighthouse performance (mobile, median of ${LIGHTHOUSE_RUNS})`]: performanceScore,
    'Lighthouse mobile runs': lh?.runs ?? 'skipped',
    'Lighthouse performance (desktop)': desktopPerformance,
    'Lighthouse accessibility': accessibilityScore,
    targets: 'ratios >= 0.5, p99 <= 50 ms, 0 errors, JS <= 200 kB, perf >= 90, a11y >= 95',
  })
  const readRatio = read.rps / baseline.rps
  const planRatio = plan.rps / baseline.rps
  console.log(
    JSON.stringify({
      bench: 'dashboard',
      readRps: Math.round(read.rps),
      readP99Ms: read.p99,
      planRps: Math.round(plan.rps),
      planP99Ms: plan.p99,
      baselineRps: Math.round(baseline.rps),
      readRatio: Number(readRatio.toFixed(2)),
      planRatio: Number(planRatio.toFixed(2)),
      errors: read.errors + plan.errors + baseline.errors,
      rssBeforeMb: Math.round(rssBefore),
      rssAfterMb: Math.round(rssAfter),
      lakeReadJsGzipKb: Number(jsGzipKb.toFixed(1)),
      lighthousePerformance: performanceScore,
      lighthouseDesktopPerformance: desktopPerformance,
      lighthouseAccessibility: accessibilityScore,
      pass:
        readRatio >= 0.5 &&
        planRatio >= 0.5 &&
        Math.max(read.p99, plan.p99) <= 50 &&
        read.errors + plan.errors === 0 &&
        jsGzipKb <= 200 &&
        performanceScore >= 90 &&
        accessibilityScore >= 95,
    }),
  )
} finally {
  for (const s of stop.reverse()) await s()
  await db.$client.end()
  await cluster.stop()
  rmSync(cluster.dataDir, { recursive: true, force: true })
}

/** Lighthouse on the signed-in Lake read: mobile (median of several runs) and desktop. */
async function lighthouseScores(
  base: string,
  cookie: string,
  stop: (() => Promise<unknown> | unknown)[],
) {
  const chrome = await chromeLauncher.launch({
    chromePath: '/usr/bin/chromium',
    chromeFlags: CHROMIUM_ARGS,
  })
  stop.push(() => chrome.kill())
  // Mobile (the default: simulated slow 4G, a 4x slower CPU) is what counts; desktop is printed too.
  const audit = async (formFactor: 'mobile' | 'desktop') => {
    const result = await lighthouse(
      `${base}/lakes/${SLUG}`,
      {
        port: chrome.port,
        output: 'json',
        logLevel: 'error',
        onlyCategories: ['performance', 'accessibility'],
        extraHeaders: { cookie },
      },
      formFactor === 'desktop' ? DESKTOP : undefined,
    )
    return result!.lhr
  }
  type Lhr = Awaited<ReturnType<typeof audit>>
  // Lighthouse's own advice for a noisy machine: several runs, and its median run (the one
  // nearest the median first paint and time to interactive).
  const mobileRuns = []
  for (let i = 0; i < LIGHTHOUSE_RUNS; i++) mobileRuns.push(await audit('mobile'))
  const mobile = computeMedianRun(filterToValidRuns(mobileRuns))
  const desktopLhr = await audit('desktop')
  writeFileSync(
    fileURLToPath(new URL('../../.tmp/lighthouse-lake-read.json', import.meta.url)),
    JSON.stringify(mobile),
  )
  const score = (lhr: Lhr, c: string) => Math.round((lhr.categories[c]?.score ?? 0) * 100)
  const metric = (id: string) => mobile.audits[id]?.displayValue ?? '—'
  const lighthouseMetrics = Object.fromEntries(
    [
      'first-contentful-paint',
      'largest-contentful-paint',
      'total-blocking-time',
      'cumulative-layout-shift',
      'speed-index',
    ].map((id) => [`mobile ${id}`, metric(id)]),
  )
  return {
    metrics: lighthouseMetrics,
    performance: score(mobile, 'performance'),
    accessibility: score(mobile, 'accessibility'),
    desktop: score(desktopLhr, 'performance'),
    runs: mobileRuns.map((l) => score(l, 'performance')).join(', '),
  }
}
