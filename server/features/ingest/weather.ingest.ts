import type { Logger } from '../../logger'
import type { Db } from '../../db/index'
import { WeatherDocument, WeatherHour } from './feed.schemas'
import { DEFAULT_POLICY, FeedError, getJson, type FetchPolicy } from './feed-client'
import { ingestRepo, type QuarantineRow, type WeatherRow } from './ingest.repo'

export interface WeatherDeps {
  db: Db
  feedUrl: string
  log: Logger
  now?: () => Date
  policy?: FetchPolicy
}

const FIRST_READ_MS = 2 * 86_400_000

function split(lakeId: string, kind: 'observed' | 'forecast', hours: unknown[], issuedAt?: string) {
  const rows: WeatherRow[] = []
  const bad: (QuarantineRow & { lakeId: string })[] = []
  hours.forEach((raw, i) => {
    const h = WeatherHour.safeParse(raw)
    const time =
      raw && typeof raw === 'object' && 'time' in raw
        ? String((raw as { time: unknown }).time)
        : `row-${i}`
    if (!h.success) {
      const issue = h.error.issues[0]
      bad.push({
        lakeId,
        feedId: `${kind}|${issuedAt ?? ''}|${time}`,
        observedAt: null,
        raw: raw ?? null,
        reason: 'invalid_weather',
        detail: `${issue?.path.join('.')}: ${issue?.message}`,
      })
      return
    }
    const w = h.data
    rows.push({
      lakeId,
      kind,
      at: new Date(w.time),
      issuedAt: issuedAt ? new Date(issuedAt) : null,
      windMs: w.windSpeed,
      // A gust below the mean wind is a reporting slip; the mean is the floor.
      gustMs: Math.max(w.windGust, w.windSpeed),
      windFromDeg: w.windFrom % 360,
      airC: w.airTemperature,
      relativeHumidityPct: w.relativeHumidity,
      pressureHpa: w.pressure,
      precipitationMm: w.precipitation,
      cloudCoverPct: w.cloudCover,
      precipitationProbabilityPct: w.precipitationProbability ?? null,
      thunderProbabilityPct: w.thunderProbability ?? null,
    })
  })
  return { rows, bad }
}

/** One pass of `ingest-weather`: each lake's hourly observations since its last, and the latest forecast. */
export async function ingestWeather(
  deps: WeatherDeps,
): Promise<{ lakes: number; failed: number; hours: number }> {
  const repo = ingestRepo(deps.db)
  const now = (deps.now ?? (() => new Date()))()
  const policy = deps.policy ?? DEFAULT_POLICY
  const summary = { lakes: 0, failed: 0, hours: 0 }
  for (const lake of await repo.lakesWithSlugs()) {
    summary.lakes++
    try {
      const since = (await repo.weatherCursor(lake.id)) ?? new Date(now.getTime() - FIRST_READ_MS)
      const base = `${deps.feedUrl}/weather/v1/lakes/${encodeURIComponent(lake.slug)}`
      const observed = WeatherDocument.safeParse(
        await getJson(
          deps.feedUrl,
          `${base}/observations?start=${since.toISOString()}&end=${now.toISOString()}`,
          policy,
        ),
      )
      if (!observed.success)
        throw new FeedError('shape', `Weather observations for ${lake.slug} have the wrong shape`)
      const obs = split(lake.id, 'observed', observed.data.hours)
      await repo.commitWeather(obs.rows, obs.bad, 'observed', now)
      const forecast = WeatherDocument.safeParse(
        await getJson(deps.feedUrl, `${base}/forecast`, policy),
      )
      if (!forecast.success)
        throw new FeedError('shape', `Weather forecast for ${lake.slug} has the wrong shape`)
      const fc = split(lake.id, 'forecast', forecast.data.hours, forecast.data.issuedAt)
      await repo.commitWeather(fc.rows, fc.bad, 'forecast', now)
      summary.hours += obs.rows.length + fc.rows.length
    } catch (err) {
      // A lake the feed does not know (404) or a failing feed: log it and go on to the next lake.
      if (!(err instanceof FeedError)) throw err
      summary.failed++
      deps.log.warn({ lake: lake.slug, err: err.message }, 'weather failed for this lake')
    }
  }
  return summary
}
