import { describe, expect, it } from 'vitest'
import {
  cautions,
  mergeCautions,
  verdictOf,
  worstOf,
  type CautionHour,
} from '../../../shared/conditions/safety'
import { heatIndexC } from '../../../shared/conditions/weather'
import { DEFAULT_SETTINGS, makeFormat } from '../../../shared/format'
import { cToF, fToC, MS_PER_KNOT } from '../../../shared/units'
import { METRIC } from '../../helpers/units'

const kinds = (c: ReturnType<typeof cautions>) => c.map((x) => `${x.kind}:${x.level}`)
const find = (c: ReturnType<typeof cautions>, kind: string) => c.find((x) => x.kind === kind)

describe('cautions', () => {
  it('always ends by deferring to local authorities and boating law', () => {
    const calm = cautions({ windMs: 1 })
    expect(calm).toHaveLength(1)
    expect(calm.at(-1)!.message).toMatch(/local authorities.*boating law/)
    expect(cautions({ windMs: 20, thunderstormProbabilityPct: 80 }).at(-1)!.kind).toBe('authority')
  })

  it('tells small boats not to launch in a 25 kt blow, with no Great Lakes figures (WMO Beaufort force 6 from 10.8 m/s; small-boat limits common practice)', () => {
    const wind = find(cautions({ windMs: 13, gustMs: 18 }), 'wind')!
    expect(wind.level).toBe('danger')
    expect(wind.message).toMatch(/Do not launch/)
    expect(wind.message).toMatch(/get off the water/)
    expect(wind.message).not.toMatch(/sheltered water\.$|Great Lakes|22 kt/)
    expect(wind.source).toMatch(/Beaufort/)
  })

  it('reads a fresh breeze as rough and whitecaps as a caution, gusts counting too (WMO Beaufort forces 5, 7, 8; common practice)', () => {
    expect(kinds(cautions({ windMs: 8.5 }))).toContain('wind:warning')
    expect(kinds(cautions({ windMs: 7.5 }))).toContain('wind:caution')
    expect(kinds(cautions({ windMs: 5, gustMs: 14 }))).toContain('wind:warning')
    expect(kinds(cautions({ windMs: 9, gustMs: 34 * MS_PER_KNOT }))).toContain('wind:danger')
    expect(find(cautions({ windMs: 4, gustMs: 6 }), 'wind')).toBeUndefined()
  })

  it('sends a small boat off the water in 3 ft waves instead of telling it to quarter into the chop (common practice)', () => {
    const waves = find(cautions({ windMs: 5, waveHeightM: 0.95 }), 'waves')!
    expect(waves.level).toBe('danger')
    expect(waves.message).toMatch(/Do not launch/)
    expect(waves.message).not.toMatch(/Quarter into the chop/i)
    expect(kinds(cautions({ windMs: 5, waveHeightM: 0.7 }))).toContain('waves:warning')
    expect(kinds(cautions({ windMs: 5, waveHeightM: 0.35 }))).toContain('waves:caution')
  })

  it('gives a lightning caution on a slight chance of thunder, 15-19 % (NWS chance wording; NWS lightning safety)', () => {
    const slight = find(cautions({ windMs: 2, thunderstormProbabilityPct: 17 }), 'lightning')!
    expect(slight.level).toBe('caution')
    expect(slight.message).toMatch(/get off the water/)
    expect(find(cautions({ windMs: 2, thunderstormProbabilityPct: 36 }), 'lightning')!.level).toBe(
      'warning',
    )
    const likely = cautions({ windMs: 3, thunderstormProbabilityPct: 60 })[0]!
    expect(likely.kind).toBe('lightning')
    expect(likely.level).toBe('danger')
    expect(likely.message).toMatch(/When thunder roars, go indoors/)
    expect(likely.message).toMatch(/30 minutes/)
  })

  it('never prints one water temperature at two levels: 9.9 °C and 10.0 °C read differently (1-10-1; 50 °F from memory)', () => {
    const cold = find(cautions({ windMs: 2, waterC: 9.9 }), 'cold-water')!
    const cool = find(cautions({ windMs: 2, waterC: 10.0 }), 'cold-water')!
    expect(cold.level).toBe('warning')
    expect(cool.level).toBe('caution')
    expect(cold.headline).toBe('Water 49.8 °F (9.9 °C)')
    expect(cool.headline).toBe('Water 50.0 °F (10.0 °C)')
    // Judged on the value as shown: 9.96 °C shows as 10.0 °C, and is judged as 10.0 °C.
    expect(find(cautions({ windMs: 2, waterC: 9.96 }), 'cold-water')!.level).toBe('caution')
    expect(cool.message).toMatch(/1-10-1/)
    expect(find(cautions({ windMs: 2, waterC: fToC(75) }), 'cold-water')).toBeUndefined()
  })

  it('follows the NWS heat index bands (80, 90, 103 °F)', () => {
    // 90 °F at 50 % is a 95 °F heat index: extreme caution, 90-103 °F (NWS).
    expect(kinds(cautions({ windMs: 2, heatIndexC: heatIndexC(fToC(90), 50) }))).toContain(
      'heat:warning',
    )
    expect(kinds(cautions({ windMs: 2, heatIndexC: heatIndexC(fToC(100), 60) }))).toContain(
      'heat:danger',
    )
  })

  it('orders the most serious first and rejects NaN', () => {
    const list = cautions({ windMs: 8, waveHeightM: 1.5, waterC: 12 })
    expect(list[0]!.level).toBe('danger')
    expect(() => cautions({ windMs: NaN })).toThrow(/windMs/)
  })
})

describe('worstOf', () => {
  const hour = (windMs: number, airC: number, rh: number, thunder = 0): CautionHour => ({
    windMs,
    gustMs: windMs * 1.4,
    airC,
    relativeHumidityPct: rh,
    thunderstormProbabilityPct: thunder,
  })

  it('judges a window by its worst hour: a 107 °F peak heat index is not shown as the 99 °F average (NWS heat index)', () => {
    const hours = [hour(2, fToC(90), 50), hour(2, fToC(96), 50), hour(2, fToC(91), 50)]
    const peak = heatIndexC(fToC(96), 50)
    // The heat index of the window's mean air temperature (92.3 °F) at 50 %.
    const ofMeans = heatIndexC(fToC(92.33), 50)
    expect(cToF(peak)).toBeCloseTo(107.6, 1)
    expect(cToF(ofMeans)).toBeLessThan(100)
    const worst = worstOf(hours)
    expect(worst.heatIndexC).toBe(peak)
    const heat = find(cautions(worst), 'heat')!
    expect(heat.level).toBe('danger')
    expect(heat.headline).toMatch(/^Heat index 107\.\d °F/)
  })

  it('takes the strongest wind, gust and chance of thunder, and the coldest wind chill (NWS wind chill 2001)', () => {
    const worst = worstOf([hour(4, -5, 60, 10), hour(13, 0, 60, 36), hour(6, -8, 60)])
    expect(worst.windMs).toBe(13)
    expect(worst.gustMs).toBeCloseTo(18.2)
    expect(worst.thunderstormProbabilityPct).toBe(36)
    // -8 °C at 6 m/s is colder than 0 °C at 13 m/s.
    expect(worst.windChillC).toBeLessThan(-13)
  })
})

describe('verdictOf', () => {
  it('is a no-go on any danger, naming it, and a caution on a warning (derived from the cautions)', () => {
    const blow = verdictOf(cautions({ windMs: 13, gustMs: 18, waterC: 15 }))
    expect(blow.verdict).toBe('no-go')
    expect(blow.reasons).toEqual([expect.stringMatching(/^Wind 25 kt/)])
    expect(verdictOf(cautions({ windMs: 8.5 })).verdict).toBe('caution')
    const fine = verdictOf(cautions({ windMs: 3, waterC: 15 }))
    expect(fine.verdict).toBe('go')
    expect(fine.reasons).toEqual([expect.stringMatching(/^Water 59\.0 °F/)])
  })
})

describe('mergeCautions', () => {
  it('gives a stormy day one line per hazard at its worst, naming the windows (NWS lightning safety)', () => {
    const windows = [
      { id: 'dawn', label: 'Dawn to mid-morning', cautions: cautions({ windMs: 2, waterC: 25 }) },
      {
        id: 'midday',
        label: 'Midday',
        cautions: cautions({ windMs: 3, thunderstormProbabilityPct: 30, heatIndexC: fToC(99) }),
      },
      {
        id: 'afternoon',
        label: 'Afternoon to dusk',
        cautions: cautions({ windMs: 3, thunderstormProbabilityPct: 36, heatIndexC: fToC(107) }),
      },
    ]
    const day = mergeCautions(windows)
    expect(day.map((c) => c.kind)).toEqual(['heat', 'lightning', 'authority'])
    const lightning = find(day, 'lightning')!
    expect(lightning.headline).toBe('Midday and afternoon to dusk: Thunderstorms 36 %')
    expect(lightning.windows).toEqual(['midday', 'afternoon'])
    expect(find(day, 'heat')!.level).toBe('danger')
  })
})

describe('waves as shown', () => {
  it('never prints the warning height at a lower level: 0.58 m shows as 0.6 m and is judged so (common practice)', () => {
    const waves = cautions({ windMs: 5, waveHeightM: 0.58 }).find((c) => c.kind === 'waves')!
    expect(waves.headline).toMatch(/\(0\.6 m\)/)
    expect(waves.level).toBe('warning')
  })
})

describe('wind as shown', () => {
  const units = ['mph', 'kmh', 'knots'] as const
  const reader = (speed: (typeof units)[number]) =>
    makeFormat({ ...DEFAULT_SETTINGS, speed, temperature: 'C', length: 'm' })
  /** The figure of "17.7 mph", "25.2 km/h", "21 kt". */
  const figure = (text: string) => Number(/^(-?\d+(?:\.\d+)?) /.exec(text)![1])
  /** The limits the source quotes, in the reader's unit: force 5, 6, 7, gale and the caution. */
  function limits(f: ReturnType<typeof makeFormat>) {
    const wind = find(cautions({ windMs: 9 }), 'wind')!
    const n = (re: RegExp) => Number(re.exec(f.caution(wind).source)![1])
    return {
      caution: n(/the (\d+(?:\.\d+)?) \S+ caution/),
      force5: n(/force 5 from (\d+(?:\.\d+)?)/),
      force6: n(/force 6 from (\d+(?:\.\d+)?)/),
      force7: n(/force 7 from (\d+(?:\.\d+)?)/),
      gale: n(/gale from (\d+(?:\.\d+)?)/),
    }
  }
  const levelOf = (c: ReturnType<typeof cautions>) => find(c, 'wind')?.level ?? null
  /** The level a figure reaches against the danger, warning and caution limits. */
  const levelAt = (x: number, [danger, warning, caution]: [number, number, number]) =>
    x >= danger ? 'danger' : x >= warning ? 'warning' : x >= caution ? 'caution' : null

  it('never prints a speed just below a limit as the figure of one at it: 7.9 m/s is 17.7 mph, 8.0 m/s 18 mph (WMO Beaufort force 5 from 8.0 m/s; NIST SP 811: 1 mph = 0.44704 m/s)', () => {
    const mph = reader('mph')
    expect(mph.speed(7.9)).toBe('17.7 mph')
    expect(levelOf(cautions({ windMs: 7.9 }))).toBe('caution')
    expect(mph.speed(8.0)).toBe('18 mph')
    expect(levelOf(cautions({ windMs: 8.0 }))).toBe('warning')
    // 7.96 m/s is judged as the 8.0 m/s it shows as.
    expect(levelOf(cautions({ windMs: 7.96 }))).toBe('warning')
    expect(mph.speed(7.96)).toBe('18 mph')
    // Whole numbers away from a limit.
    expect(mph.speed(0.44704 * 12)).toBe('12 mph')
    // km/h: 7.0 m/s is 25.2 km/h exactly (1 km/h = 1/3.6 m/s), the caution limit.
    expect(reader('kmh').speed(7.0)).toBe('25.2 km/h')
    expect(reader('kmh').speed(6.9)).toBe('25 km/h')
    // knots: force 6 from 10.8 m/s is 21.0 kt (1 kt = 1852/3600 m/s).
    expect(reader('knots').speed(10.7)).toBe('20.8 kt')
    expect(levelOf(cautions({ windMs: 10.7 }))).toBe('warning')
    expect(reader('knots').speed(10.8)).toBe('21 kt')
    expect(levelOf(cautions({ windMs: 10.8 }))).toBe('danger')
  })

  it.each(units)(
    'in %s, the figure shown and the limits quoted always give the level the caution has (WMO Beaufort scale; common practice)',
    (unit) => {
      const f = reader(unit)
      const l = limits(f)
      for (let cms = 500; cms <= 2000; cms += 1) {
        const ms = cms / 100
        const shown = figure(f.speed(ms))
        // Sustained wind, gusts no stronger: the wind limits decide.
        expect(levelOf(cautions({ windMs: ms })), `${ms} m/s shown as ${shown}`).toBe(
          levelAt(shown, [l.force6, l.force5, l.caution]),
        )
        // A light wind with a gust: the gust limits (force 6, force 7, gale) decide.
        expect(levelOf(cautions({ windMs: 3, gustMs: ms })), `gust ${ms} m/s as ${shown}`).toBe(
          levelAt(shown, [l.gale, l.force7, l.force6]),
        )
      }
    },
  )
})

describe('a caution’s source in the reader’s units', () => {
  const metric = makeFormat(METRIC)
  const imperial = makeFormat(DEFAULT_SETTINGS)
  const all = cautions({
    windMs: 9,
    waveHeightM: 0.7,
    waterC: 12,
    heatIndexC: 33,
    windChillC: -3,
  }).filter((c) => c.kind !== 'authority')

  it('quotes the limits in km/h, metres and °C to a metric reader, and in mph, feet and °F to a US one (NIST SP 811 factors)', () => {
    const sourceOf = (f: typeof metric, kind: string) => f.caution(find(all, kind)!).source
    expect(sourceOf(metric, 'wind')).toMatch(/force 5 from 28\.8 km\/h/) // 8.0 m/s × 3.6
    expect(sourceOf(imperial, 'wind')).toMatch(/force 5 from 17\.9 mph/) // 8.0 / 0.44704
    expect(sourceOf(metric, 'waves')).toMatch(/\(0\.3 m, 0\.6 m and 0\.9 m\)/)
    expect(sourceOf(imperial, 'waves')).toMatch(/\(1 ft, 2 ft and 3 ft\).*4 ft/)
    expect(sourceOf(metric, 'cold-water')).toMatch(/21\.1 °C and 10 °C/) // 70 °F, 50 °F
    expect(sourceOf(imperial, 'cold-water')).toMatch(/70 °F and 50 °F/)
    expect(sourceOf(imperial, 'heat')).toMatch(/80 °F, 90 °F, 103 °F/) // NWS heat index bands
    expect(sourceOf(metric, 'wind-chill')).toMatch(/-28 °C frostbite/)
    expect(sourceOf(imperial, 'wind-chill')).toMatch(/-18\.4 °F frostbite/)
    for (const c of all) {
      expect(metric.caution(c).source, c.kind).not.toMatch(/m\/s|mph|\bkt\b|\bft\b|°F/)
      expect(imperial.caution(c).source, c.kind).not.toMatch(/m\/s|km\/h|\bkt\b|\d m\b|°C/)
    }
  })

  it('never prints a temperature at a level its band does not start at: 32.2 °C shows as 90.0 °F and is the 90 °F band, 21.1 °C shows as 70.0 °F and is no caution (NWS heat index bands; 70 °F from memory)', () => {
    const heat = find(cautions({ windMs: 2, heatIndexC: 32.2 }), 'heat')!
    expect(imperial.caution(heat).headline).toBe('Heat index 90.0 °F')
    expect(heat.level).toBe('warning')
    expect(metric.caution(heat).source).toMatch(/32\.2 °C/)
    expect(find(cautions({ windMs: 2, heatIndexC: 32.1 }), 'heat')!.level).toBe('caution')
    // 103 °F is 39.44 °C, but 39.4 °C shows as 102.9 °F: for a °C reader the band starts at 39.5.
    expect(find(cautions({ windMs: 2, heatIndexC: 39.4 }), 'heat')!.level).toBe('warning')
    expect(find(cautions({ windMs: 2, heatIndexC: 39.5 }), 'heat')!.level).toBe('danger')
    expect(metric.caution(heat).source).toMatch(/39\.5 °C/)
    expect(find(cautions({ windMs: 2, waterC: 21.1 }), 'cold-water')).toBeUndefined()
    const cool = find(cautions({ windMs: 2, waterC: 21.0 }), 'cold-water')!
    expect(imperial.caution(cool).headline).toBe('Water 69.8 °F')
  })
})
