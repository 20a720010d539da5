import { rmSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import { performance } from 'node:perf_hooks'
import { fileURLToPath } from 'node:url'
import { eq, sql } from 'drizzle-orm'
import sharp from 'sharp'
import { startCluster } from '../../server/db/cluster'
import { createDb } from '../../server/db/index'
import { migrateDb } from '../../server/db/migrate'
import { lakes } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { hashPassword } from '../../server/features/auth/passwords'
import { backfillReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import { createAppServer } from '../../server/http/server'
import { PASSWORD, testApp } from '../helpers/app'
import { ingestDeps, startTestFeed } from '../helpers/feed'
import { startTestS3 } from '../helpers/s3'

/**
 * The catch journal at scale: 100,000 catches across 1,000 anglers (100 each, with conditions and
 * lures spread over every group the insights count). Timed over real HTTP against the app:
 * `GET /api/journal/insights` for one angler (p99 over 1,000 calls, `GET /api/me` as the baseline),
 * and logging a catch with a 5 MB photo (upload: EXIF read, resized to two copies without
 * metadata, stored in the S3 stand-in; then the catch with its conditions worked out from stored
 * readings), against the same catch without a photo.
 */
const ANGLERS = 1_000
const EACH = 100
const INSIGHT_CALLS = 1_000
const PHOTO_RUNS = 10
const PHOTO_BYTES = 5 * 1024 * 1024
const dataDir = fileURLToPath(new URL('../../.tmp/pg-bench-journal', import.meta.url))

const cluster = await startCluster({
  dataDir,
  port: 54397,
  user: 'bench',
  password: 'bench',
  database: 'bench',
  durable: false,
})
const db = createDb(cluster.url(), { max: 8 })
const s3 = await startTestS3('bench-photos')
const feed = await startTestFeed(new Date().toISOString())

/**
 * A phone-sized photo (4032 × 3024, 12 megapixels) of at least `bytes`: smooth gradients with
 * grain, the grain raised until the JPEG reaches the size (a real 5 MB photo is mostly detail).
 */
async function photoOf(bytes: number): Promise<Buffer> {
  const [w, h] = [4032, 3024]
  for (let grain = 0.1; ; grain += 0.03) {
    const raw = Buffer.alloc(w * h * 3)
    let seed = 1
    for (let y = 0; y < h; y++)
      for (let x = 0; x < w; x++) {
        seed = (seed * 1103515245 + 12345) >>> 0
        const n = ((seed >>> 16) & 0xff) * grain
        const i = (y * w + x) * 3
        raw[i] = ((x / w) * 200 + n) & 0xff
        raw[i + 1] = ((y / h) * 180 + n) & 0xff
        raw[i + 2] = (((x + y) / (w + h)) * 255 + n) & 0xff
      }
    const jpeg = await sharp(raw, { raw: { width: w, height: h, channels: 3 } })
      .jpeg({ quality: 95 })
      .toBuffer()
    if (jpeg.length >= bytes) return jpeg
  }
}

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)]!
}

try {
  await migrateDb(db)
  await seedDemo(db)
  const [lake] = await db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  const deps = ingestDeps(db, feed)
  await backfillReadings(deps, lake!.id, 20)
  await ingestWeather(deps)
  await conditionsFor(db).refreshAll(feed.now())

  const hash = await hashPassword(PASSWORD)
  const t = performance.now()
  await db.execute(sql`
    insert into users (email, password_hash, role)
    select 'angler-' || g || '@journal.bench', ${hash}, 'angler' from generate_series(1, ${ANGLERS}) g`)
  await db.execute(sql`
    insert into catches (user_id, lake_id, caught_at, species, length_m, weight_kg, released, lure, conditions)
    select u.id, l.ids[1 + (g % array_length(l.ids, 1))],
      now() - (g * 3 || ' days')::interval - (u.n % 12 || ' hours')::interval,
      (array['largemouth', 'smallmouth', 'spotted']::species[])[1 + (g + u.n) % 3],
      0.28 + ((g * 7 + u.n) % 25) / 100.0, 0.5 + ((g * 3 + u.n) % 30) / 10.0, g % 5 <> 0,
      jsonb_build_object('family',
        (array['spinnerbait', 'jig', 'jerkbait', 'topwater', 'soft-plastic worm', 'bladed jig'])[1 + (g * 5 + u.n) % 6],
        'blade', case when g % 4 = 0 then 'colorado' end, 'color', 'white', 'size', '',
        'trailer', '', 'trailerHook', null, 'retrieve', ''),
      jsonb_build_object(
        'waterC', 4 + (g * 13 + u.n) % 26,
        'clarity', jsonb_build_object('class',
          (array['muddy', 'stained', 'lightly-stained', 'clear', 'very-clear'])[1 + (g + u.n * 3) % 5],
          'secchiM', 1.2, 'trend', 'steady'),
        'phase', (array['winter', 'early-pre-spawn', 'pre-spawn', 'spawn', 'post-spawn', 'summer', 'fall'])[1 + (g * 11 + u.n) % 7],
        'wind', jsonb_build_object('ms', (g % 11)::float8, 'gustMs', (g % 11 + 3)::float8, 'fromDeg', (g * 37) % 360),
        'bankExposure', (array['lee', 'side wind', 'windward', 'rough'])[1 + (g * 3 + u.n) % 4],
        'sky', (array['sun', 'partly', 'overcast'])[1 + (g + u.n) % 3],
        'cloudCoverPct', (g * 17) % 100, 'airC', 15, 'pressure', null, 'verdict', 'go',
        'timeOfDay', (array['dawn', 'midday', 'afternoon'])[1 + (g + u.n * 2) % 3],
        'localDate', to_char(now() - (g * 3 || ' days')::interval, 'YYYY-MM-DD'),
        'computedAt', to_char(now() at time zone 'utc', 'YYYY-MM-DD"T"HH24:MI:SS"Z"'))
    from (select id, row_number() over (order by email) as n from users where email like '%@journal.bench') u,
      (select array_agg(id order by slug) as ids from lakes) l,
      generate_series(1, ${EACH}) g`)
  await db.execute(sql`analyze catches`)
  const loadMs = performance.now() - t

  const app = testApp(db, { photos: s3.photos })
  const server = createAppServer(app)
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`
  try {
    const signin = await fetch(`${base}/auth/signin`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'angler-500@journal.bench', password: PASSWORD }),
    })
    const cookie = signin.headers.get('set-cookie')!.split(';')[0]!
    const get = async (path: string) => {
      const started = performance.now()
      const res = await fetch(`${base}${path}`, { headers: { cookie } })
      await res.arrayBuffer()
      if (!res.ok) throw new Error(`${path}: ${res.status}`)
      return performance.now() - started
    }
    const timed = async (path: string, n: number) => {
      for (let i = 0; i < 50; i++) await get(path)
      const ms: number[] = []
      for (let i = 0; i < n; i++) ms.push(await get(path))
      return ms
    }
    const insights = await timed('/journal/insights', INSIGHT_CALLS)
    const filtered = await timed('/journal/insights?lake=quillmere&season=summer', INSIGHT_CALLS)
    const me = await timed('/me', INSIGHT_CALLS)

    const photo = await photoOf(PHOTO_BYTES)
    const body = (photoId: string | null, i: number) =>
      JSON.stringify({
        lakeSlug: 'quillmere',
        caughtAt: new Date(feed.now().getTime() - (i + 1) * 600_000).toISOString(),
        species: 'largemouth',
        lengthM: 0.45,
        released: true,
        lure: { family: 'spinnerbait', blade: 'colorado' },
        photoId,
      })
    const logCatch = async (i: number, withPhoto: boolean) => {
      const started = performance.now()
      let photoId: string | null = null
      if (withPhoto) {
        const form = new FormData()
        form.append('file', new Blob([new Uint8Array(photo)], { type: 'image/jpeg' }), 'fish.jpg')
        const up = await fetch(`${base}/journal/photos?lake=quillmere`, {
          method: 'POST',
          headers: { cookie },
          body: form,
        })
        if (up.status !== 201) throw new Error(`photo: ${up.status} ${await up.text()}`)
        photoId = ((await up.json()) as { id: string }).id
      }
      const made = await fetch(`${base}/journal/catches`, {
        method: 'POST',
        headers: { cookie, 'content-type': 'application/json' },
        body: body(photoId, i),
      })
      const view = (await made.json()) as { conditions: { waterC: number | null } | null }
      if (made.status !== 201 || view.conditions?.waterC == null)
        throw new Error(`catch: ${made.status} ${JSON.stringify(view)}`)
      return performance.now() - started
    }
    await logCatch(100, true) // warm-up: sharp's first image, the S3 connection
    const withPhoto: number[] = []
    const without: number[] = []
    for (let i = 0; i < PHOTO_RUNS; i++) {
      withPhoto.push(await logCatch(i, true))
      without.push(await logCatch(PHOTO_RUNS + i, false))
    }
    const stored = (await s3.keys()).length

    const p99 = pct(insights, 99)
    const ratio = p99 / pct(me, 99)
    const photoMax = Math.max(...withPhoto)
    console.table({
      'catches loaded': ANGLERS * EACH,
      anglers: ANGLERS,
      'load (ms)': Math.round(loadMs),
      'insights, one angler: p50 (ms)': pct(insights, 50).toFixed(1),
      'insights, one angler: p99 (ms)': p99.toFixed(1),
      'insights, lake + season filter: p99 (ms)': pct(filtered, 99).toFixed(1),
      'baseline GET /api/me: p99 (ms)': pct(me, 99).toFixed(1),
      'insights p99 / baseline p99': ratio.toFixed(2),
      'photo size (MB)': (photo.length / 2 ** 20).toFixed(2),
      'log a catch with the photo: median (ms)': Math.round(pct(withPhoto, 50)),
      'log a catch with the photo: max (ms)': Math.round(photoMax),
      'log a catch without a photo: median (ms)': Math.round(pct(without, 50)),
      'photo / no photo, median': (pct(withPhoto, 50) / pct(without, 50)).toFixed(2),
      'objects stored (display + thumb)': stored,
      target: 'insights p99 ≤ 100 ms; a catch with a 5 MB photo ≤ 1.5 s',
    })
    console.log(
      JSON.stringify({
        bench: 'journal',
        catches: ANGLERS * EACH,
        anglers: ANGLERS,
        insightsP50Ms: Number(pct(insights, 50).toFixed(1)),
        insightsP99Ms: Number(p99.toFixed(1)),
        filteredInsightsP99Ms: Number(pct(filtered, 99).toFixed(1)),
        baselineMeP99Ms: Number(pct(me, 99).toFixed(1)),
        insightsToBaselineP99: Number(ratio.toFixed(2)),
        photoBytes: photo.length,
        photoCatchMedianMs: Math.round(pct(withPhoto, 50)),
        photoCatchMaxMs: Math.round(photoMax),
        plainCatchMedianMs: Math.round(pct(without, 50)),
        photoToPlainMedian: Number((pct(withPhoto, 50) / pct(without, 50)).toFixed(2)),
        pass: p99 <= 100 && photoMax <= 1_500,
      }),
    )
  } finally {
    await new Promise((resolve) => server.close(resolve))
  }
} finally {
  await feed.close()
  await s3.close()
  await db.$client.end()
  await cluster.stop()
  rmSync(cluster.dataDir, { recursive: true, force: true })
}
