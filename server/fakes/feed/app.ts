import express, { type Request, type Response } from 'express'
import { PARAMETERS, type Parameter } from '../../../shared/readings'
import { cToF, M_PER_FT, mToFt } from '../../../shared/units'
import { FaultInjector, type FaultPlan, type ItemFault } from './faults'
import { LakeWorld, type FeedLake } from './model'
import { isScenarioName, SCENARIOS, ScriptedDays, type ScenarioName } from './scenarios'

export interface FeedStation {
  thingId: number
  name: string
  lake: FeedLake
  /** What the station publishes, in the units it publishes them. */
  datastreams: { parameter: Parameter; unit: string }[]
}

export interface ServedObservation {
  datastreamId: number
  at: string
  value: number
  unit: string
}

/** What the fake has handed out in complete, well-formed responses: the ground truth for tests. */
export interface FeedTruth {
  good: Map<string, ServedObservation>
  bad: Map<string, ServedObservation & { fault: ItemFault }>
}

export interface FeedOptions {
  seed: number
  stations: FeedStation[]
  /** The feed's clock: nothing after it has been observed yet. */
  now?: () => Date
  /** Keep the ground truth of what was served (tests); off for load runs. Default on. */
  recordTruth?: boolean
  /** A named scenario to play from the start, on its own lake and day unless these are given. */
  scenario?: ScenarioName | ScenarioChoice
}

/** Which scenario to play, and where and when: by default its own lake and day. */
export interface ScenarioChoice {
  name: ScenarioName
  /** The lake's slug. */
  lake?: string
  /** The local date the scenario is about (YYYY-MM-DD), to move it on the calendar. */
  day?: string
}

/** What a lake is playing, as the controls and `/__admin/scenario` report it. */
export interface ScenarioState {
  lake: string
  name: ScenarioName
  day: string
  /** The instant a test sets its clock to. */
  clock: string
}

const QUARTER = 900_000
const DAY = 86_400_000
const UNIT_NAMES: Record<string, { name: string; definition: string }> = {
  '°C': { name: 'degree Celsius', definition: 'http://qudt.org/vocab/unit/DEG_C' },
  '°F': { name: 'degree Fahrenheit', definition: 'http://qudt.org/vocab/unit/DEG_F' },
  ft: { name: 'foot', definition: 'http://qudt.org/vocab/unit/FT' },
  m: { name: 'metre', definition: 'http://qudt.org/vocab/unit/M' },
  FNU: { name: 'formazin nephelometric unit', definition: 'ISO 7027' },
  NTU: { name: 'nephelometric turbidity unit', definition: 'EPA 180.1' },
  'mg/L': { name: 'milligram per litre', definition: 'http://qudt.org/vocab/unit/MilliGM-PER-L' },
}

/** The published value of a parameter at t, in the station's unit, rounded as agencies round. */
function published(world: LakeWorld, parameter: Parameter, unit: string, t: number): number {
  const si =
    parameter === 'water_temp'
      ? world.waterC(t)
      : parameter === 'gauge_height'
        ? world.gaugeFt(t) * M_PER_FT
        : parameter === 'turbidity'
          ? world.turbidityFnu(t)
          : parameter === 'dissolved_oxygen'
            ? world.oxygenMgL(t)
            : world.secchiM(t)
  const value = unit === '°F' ? cToF(si) : unit === 'ft' ? mToFt(si) : si
  return Math.round(value * 100) / 100
}

/** A value no sensor should report: hot water, negative turbidity, a 30 ft jump in the level. */
function implausible(parameter: Parameter, unit: string, value: number): number {
  if (parameter === 'water_temp') return unit === '°F' ? 140 : 60
  if (parameter === 'gauge_height') return value + (unit === 'ft' ? 30 : 30 * M_PER_FT)
  return -5
}

interface TimeFilter {
  after?: number
  afterInclusive?: boolean
  before?: number
  beforeInclusive?: boolean
}

/** The subset of SensorThings $filter we serve: phenomenonTime gt|ge|lt|le <ISO>, joined by and. */
function parseFilter(filter: string | undefined): TimeFilter | null {
  const out: TimeFilter = {}
  if (!filter) return out
  for (const part of filter.split(/\s+and\s+/i)) {
    const m = /^\s*phenomenonTime\s+(gt|ge|lt|le)\s+(\S+)\s*$/i.exec(part)
    const t = m ? Date.parse(m[2]!) : NaN
    if (!m || Number.isNaN(t)) return null
    const op = m[1]!.toLowerCase()
    if (op === 'gt' || op === 'ge') Object.assign(out, { after: t, afterInclusive: op === 'ge' })
    else Object.assign(out, { before: t, beforeInclusive: op === 'le' })
  }
  return out
}

function observationTimes(parameter: Parameter, f: TimeFilter, now: number): number[] {
  const step = PARAMETERS[parameter].cadenceMin === 1440 ? DAY : QUARTER
  // Daily readings are taken at 15:00 UTC.
  const offset = step === DAY ? 15 * 3_600_000 : 0
  const lo = f.after ?? now - 7 * DAY
  let t = Math.ceil((lo - offset) / step) * step + offset
  if (t === f.after && !f.afterInclusive) t += step
  const hi = Math.min(f.before ?? now, now)
  // Up to and including now, unless the filter ends earlier with lt.
  const inclusive = f.before === undefined || f.before > now || f.beforeInclusive === true
  const times: number[] = []
  for (; inclusive ? t <= hi : t < hi; t += step) times.push(t)
  return times
}

export function createFeed(opts: FeedOptions) {
  const now = () => (opts.now ? opts.now() : new Date()).getTime()
  const faults = new FaultInjector(opts.seed)
  const truth: FeedTruth = { good: new Map(), bad: new Map() }
  const keepTruth = opts.recordTruth ?? true
  const worlds = new Map<string, LakeWorld>()
  const lakes = [...new Map(opts.stations.map((s) => [s.lake.slug, s.lake])).values()]
  lakes.forEach((lake, i) => worlds.set(lake.slug, new LakeWorld(lake, opts.seed, i)))
  const controls = {
    faults,
    truth,
    /** Stations that answer 404 as if removed from the feed. */
    disappeared: new Set<number>(),
    /** Stations that stop reporting after an instant (ms). */
    silentAfter: new Map<number, number>(),
    setPlan(plan: Partial<FaultPlan>) {
      faults.plan = { ...faults.plan, ...plan }
    },
    /** Plays a named scenario on its lake (or `choice.lake`), replacing any it was playing. */
    setScenario(choice: ScenarioName | ScenarioChoice): ScenarioState {
      const { name, lake, day } = typeof choice === 'string' ? { name: choice } : choice
      if (!isScenarioName(name)) throw new Error(`No scenario named ${String(name)}.`)
      const scenario = SCENARIOS[name]
      const slug = lake ?? scenario.lake
      const world = worlds.get(slug)
      if (!world) throw new Error(`The feed has no lake ${slug}.`)
      world.script = new ScriptedDays(scenario, day)
      return stateOf(slug, world.script)
    },
    /** Back to the synthetic world: on one lake, or on every lake when none is named. */
    clearScenario(lake?: string) {
      for (const [slug, world] of worlds) if (!lake || slug === lake) world.script = null
    },
    /** The scenarios being played, one per lake at most. */
    scenarios(): ScenarioState[] {
      return [...worlds].flatMap(([slug, w]) => (w.script ? [stateOf(slug, w.script)] : []))
    },
  }
  if (opts.scenario) controls.setScenario(opts.scenario)

  function stateOf(lake: string, script: ScriptedDays): ScenarioState {
    const name = script.scenario.name as ScenarioName
    return { lake, name, day: script.day, clock: script.clock.toISOString() }
  }

  const datastreams = opts.stations.flatMap((station) =>
    station.datastreams.map((ds, i) => ({ id: station.thingId * 10 + i, station, ...ds })),
  )
  const datastreamById = new Map(datastreams.map((d) => [d.id, d]))
  const base = (req: Request) => `${req.protocol}://${req.get('host')}/v1.1`

  const dsJson = (req: Request, ds: (typeof datastreams)[number]) => ({
    '@iot.id': ds.id,
    '@iot.selfLink': `${base(req)}/Datastreams(${ds.id})`,
    name: `${ds.station.name} ${PARAMETERS[ds.parameter].name}`,
    unitOfMeasurement: { symbol: ds.unit, ...UNIT_NAMES[ds.unit] },
    ObservedProperty: {
      '@iot.id': PARAMETERS[ds.parameter].code,
      name: PARAMETERS[ds.parameter].name,
      definition: `parameter code ${PARAMETERS[ds.parameter].code}`,
    },
    'Observations@iot.navigationLink': `${base(req)}/Datastreams(${ds.id})/Observations`,
  })

  /** Sends a body under the plan's request faults; `onSent` runs only when it arrived whole. */
  async function send(req: Request, res: Response, body: unknown, onSent?: () => void) {
    const fault = faults.forRequest(
      typeof req.query.fault === 'string' ? req.query.fault : undefined,
    )
    if (fault) faults.count(fault)
    if (fault === 'http500' || fault === 'http503') {
      res.status(fault === 'http500' ? 500 : 503).json({ error: 'injected' })
      return
    }
    if (fault === 'slow') await new Promise((r) => setTimeout(r, faults.plan.slowMs || 2000))
    if (req.socket.destroyed) return
    const text = JSON.stringify(body)
    res.type('application/json')
    if (fault === 'truncated') return void res.send(text.slice(0, Math.floor(text.length / 2)))
    if (fault === 'malformed') return void res.send(`{"value": [${text.slice(1, 40)}`)
    res.on('finish', () => onSent?.())
    res.send(text)
  }

  const app = express()
  app.disable('x-powered-by')

  app.get('/v1.1/Things', (req, res) => {
    const expand = String(req.query.$expand ?? '').includes('Datastreams')
    const listed = opts.stations.filter((s) => !controls.disappeared.has(s.thingId))
    faults.count('disappeared', opts.stations.length - listed.length)
    const value = listed.map((s) => ({
      '@iot.id': s.thingId,
      name: s.name,
      properties: { lake: s.lake.slug },
      'Datastreams@iot.navigationLink': `${base(req)}/Things(${s.thingId})/Datastreams`,
      ...(expand
        ? { Datastreams: datastreams.filter((d) => d.station === s).map((d) => dsJson(req, d)) }
        : {}),
    }))
    void send(req, res, { value })
  })

  app.get(/^\/v1\.1\/Things\((\d+)\)\/Datastreams$/, (req, res) => {
    const id = Number((req.params as Record<string, string>)[0])
    const station = opts.stations.find((s) => s.thingId === id)
    if (!station || controls.disappeared.has(id)) {
      if (station) faults.count('disappeared')
      return void res.status(404).json({ error: 'no such Thing' })
    }
    // $expand=Observations($filter=...;$orderby=...;$top=...): each datastream's first page inline.
    const nested = /^Observations\((.*)\)$/.exec(String(req.query.$expand ?? ''))
    const inner: Query = Object.fromEntries(
      (nested?.[1] ?? '')
        .split(';')
        .filter(Boolean)
        .map((kv) => [kv.slice(0, kv.indexOf('=')), kv.slice(kv.indexOf('=') + 1)]),
    )
    inner.itemFault = typeof req.query.itemFault === 'string' ? req.query.itemFault : undefined
    const served: Served = { good: [], bad: [] }
    const value = []
    for (const ds of datastreams.filter((d) => d.station === station)) {
      const json: Record<string, unknown> = dsJson(req, ds)
      if (nested) {
        const page = observationsPage(req, ds, inner, served)
        if (!page) return void res.status(400).json({ error: 'unsupported $filter' })
        json.Observations = page.value
        if (page.nextLink) json['Observations@iot.nextLink'] = page.nextLink
      }
      value.push(json)
    }
    void send(req, res, { value }, record(served))
  })

  type Query = Record<string, string | undefined>
  type Served = {
    good: [string, ServedObservation][]
    bad: [string, ServedObservation & { fault: ItemFault }][]
  }

  /** One page of a datastream's observations under the plan's item faults, or null for a bad $filter. */
  function observationsPage(
    req: Request,
    ds: (typeof datastreams)[number],
    q: Query,
    served: Served,
  ) {
    const filter = parseFilter(q.$filter)
    if (!filter) return null
    const top = Math.min(Number(q.$top ?? 100) || 100, 1000)
    const skip = Math.max(Number(q.$skip ?? 0) || 0, 0)
    const silent = controls.silentAfter.get(ds.station.thingId)
    const limit = silent === undefined ? now() : Math.min(now(), silent)
    let times = observationTimes(ds.parameter, filter, limit)
    if ((q.$orderby ?? '').toLowerCase().includes('desc')) times = times.reverse()
    const world = worlds.get(ds.station.lake.slug)!
    const value: Record<string, unknown>[] = []
    let shuffle = false
    for (const t of times.slice(skip, skip + top)) {
      const obsId = `${ds.id}-${t / 60_000}`
      const at = new Date(t).toISOString()
      let result = published(world, ds.parameter, ds.unit, t)
      const fault = faults.forItem(q.itemFault)
      if (fault) faults.count(fault)
      if (fault === 'gap') continue
      if (fault === 'out-of-order') shuffle = true
      if (fault === 'implausible') {
        result = implausible(ds.parameter, ds.unit, result)
        if (keepTruth)
          served.bad.push([obsId, { datastreamId: ds.id, at, value: result, unit: ds.unit, fault }])
      } else if (keepTruth) {
        served.good.push([obsId, { datastreamId: ds.id, at, value: result, unit: ds.unit }])
      }
      const obs = { '@iot.id': obsId, phenomenonTime: at, resultTime: at, result }
      value.push(obs)
      if (fault === 'duplicate') value.push({ ...obs })
    }
    if (shuffle) value.reverse()
    let nextLink: string | undefined
    if (skip + top < times.length) {
      const next = new URLSearchParams({
        ...(q.$filter && { $filter: q.$filter }),
        ...(q.$orderby && { $orderby: q.$orderby }),
      })
      next.set('$top', String(top))
      next.set('$skip', String(skip + top))
      nextLink = `${base(req)}/Datastreams(${ds.id})/Observations?${next}`
    }
    return { value, nextLink }
  }

  const record = (served: Served) => () => {
    for (const [k, v] of served.good) truth.good.set(k, v)
    for (const [k, v] of served.bad) truth.bad.set(k, v)
  }

  app.get(/^\/v1\.1\/Datastreams\((\d+)\)\/Observations$/, (req, res) => {
    const id = Number((req.params as Record<string, string>)[0])
    const ds = datastreamById.get(id)
    if (!ds || controls.disappeared.has(ds.station.thingId)) {
      if (ds) faults.count('disappeared')
      return void res.status(404).json({ error: 'no such Datastream' })
    }
    const served: Served = { good: [], bad: [] }
    const page = observationsPage(req, ds, req.query as Query, served)
    if (!page) return void res.status(400).json({ error: 'unsupported $filter' })
    const body = { value: page.value, ...(page.nextLink && { '@iot.nextLink': page.nextLink }) }
    void send(req, res, body, record(served))
  })

  const WEATHER_UNITS = {
    windSpeed: 'm/s',
    windGust: 'm/s',
    windFrom: 'degree true',
    airTemperature: '°C',
    relativeHumidity: '%',
    pressure: 'hPa',
    precipitation: 'mm',
    cloudCover: '%',
    precipitationProbability: '%',
    thunderProbability: '%',
  }

  const hourJson = (world: LakeWorld, t: number, forecastLeadH = 0) => {
    const w = world.weather(t)
    // Forecasts drift further from what happens the further ahead they look; a scenario's hours
    // are forecast as scripted.
    const err = world.scriptsWeather(t)
      ? 1
      : 1 + 0.3 * (forecastLeadH / 168) * Math.sin(t / 3_600_000)
    return {
      time: new Date(t).toISOString(),
      windSpeed: +(w.windMs * err).toFixed(1),
      windGust: +(w.gustMs * err).toFixed(1),
      windFrom: Math.round(w.windFromDeg),
      airTemperature: +w.airC.toFixed(1),
      relativeHumidity: Math.round(w.relativeHumidityPct),
      pressure: +w.pressureHpa.toFixed(1),
      precipitation: +w.precipitationMm.toFixed(1),
      cloudCover: Math.round(w.cloudCoverPct),
      precipitationProbability: w.precipitationProbabilityPct,
      thunderProbability: w.thunderProbabilityPct,
    }
  }

  app.get('/weather/v1/lakes/:slug/observations', (req, res) => {
    const world = worlds.get(req.params.slug)
    if (!world) return void res.status(404).json({ error: 'no such lake' })
    const end = Math.min(Date.parse(String(req.query.end ?? '')) || now(), now())
    const start = Date.parse(String(req.query.start ?? '')) || end - DAY
    const hours: unknown[] = []
    for (
      let t = Math.floor(start / 3_600_000 + 1) * 3_600_000;
      t <= end && hours.length < 24 * 400;
      t += 3_600_000
    ) {
      hours.push(hourJson(world, t))
    }
    void send(req, res, { lake: world.lake.slug, units: WEATHER_UNITS, hours })
  })

  app.get('/weather/v1/lakes/:slug/forecast', (req, res) => {
    const world = worlds.get(req.params.slug)
    if (!world) return void res.status(404).json({ error: 'no such lake' })
    const issued = Math.floor(now() / 3_600_000) * 3_600_000
    const hours = Array.from({ length: 168 }, (_, i) =>
      hourJson(world, issued + (i + 1) * 3_600_000, i + 1),
    )
    void send(req, res, {
      lake: world.lake.slug,
      issuedAt: new Date(issued).toISOString(),
      units: WEATHER_UNITS,
      hours,
    })
  })

  // The fake's own admin endpoint: switch faults for a run without restarting it.
  app.post('/__admin/faults', express.json(), (req, res) => {
    controls.setPlan(req.body as Partial<FaultPlan>)
    res.json({ plan: faults.plan, injected: Object.fromEntries(faults.injected) })
  })
  app.get('/__admin/faults', (_req, res) => {
    res.json({
      plan: faults.plan,
      injected: Object.fromEntries(faults.injected),
      total: faults.total,
    })
  })

  // Scenarios: { name, lake?, day? } plays one; { name: null, lake? } goes back to the world.
  app.post('/__admin/scenario', express.json(), (req, res) => {
    const body = (req.body ?? {}) as { name?: unknown; lake?: unknown; day?: unknown }
    const lake = typeof body.lake === 'string' ? body.lake : undefined
    if (body.name === null) {
      controls.clearScenario(lake)
      return void res.json({ active: controls.scenarios() })
    }
    if (!isScenarioName(body.name))
      return void res.status(400).json({ error: 'unknown scenario', names: Object.keys(SCENARIOS) })
    const day = typeof body.day === 'string' ? body.day : undefined
    try {
      const state = controls.setScenario({ name: body.name, lake, day })
      res.json({ ...state, active: controls.scenarios() })
    } catch (err) {
      res.status(400).json({ error: (err as Error).message })
    }
  })
  app.get('/__admin/scenario', (_req, res) => {
    res.json({
      active: controls.scenarios(),
      scenarios: Object.values(SCENARIOS).map((s) => ({
        name: s.name,
        summary: s.summary,
        lake: s.lake,
        day: s.day,
        clockHour: s.clockHour,
        facts: s.facts,
      })),
    })
  })

  return { app, controls }
}
export type Feed = ReturnType<typeof createFeed>
