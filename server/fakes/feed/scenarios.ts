import { addDays, HOUR_MS, zonedMidnight } from '../../../shared/time'
import type { WeatherSample } from './model'

/**
 * Named scenario days: scripted water and weather that replace the synthetic world of one lake
 * around one local date, so tests can check what the product says on the days that matter.
 *
 * A track is a list of keys `[hour, value]`, linearly interpolated between keys and absent outside
 * them. `hour` counts local clock hours from midnight starting the scenario's day: day k at hour h
 * is `k * 24 + h` (see `at`), so day -1 at 23:00 is -1, and keys stay on the local clock across a
 * change to or from daylight saving time.
 */
export type Track = readonly (readonly [hour: number, value: number])[]

export interface ScenarioWater {
  /** Daily mean water temperature, °C; the day's swing and sensor noise are added on top. */
  tempC: Track
  turbidityFnu: Track
  /** Gauge height above the lake's normal pool, feet. */
  levelFt: Track
}

/** Weather tracks. Wind and air span the scripted hours; inside them a missing track has a quiet default. */
export type ScenarioWeather = { windMs: Track; airC: Track } & Partial<
  Record<Exclude<keyof WeatherSample, 'windMs' | 'airC'>, Track>
>

export interface Scenario {
  name: string
  summary: string
  /** The lake it plays on unless another is chosen. */
  lake: string
  /** The time zone of the keys' local clock (the lake's). */
  timeZone: string
  /** The local date the scenario is about. */
  day: string
  /** Local hour on `day` at which a test sets its clock. */
  clockHour: number
  /** Days of readings to backfill so the lake read sees its 30-day window. */
  backfillDays: number
  /** What the engine is expected to see, in numbers, for the tests and for DEVELOPERS.md. */
  facts: Record<string, number | string>
  water: ScenarioWater
  weather: ScenarioWeather
}

/** Day k of a scenario at local hour h, as a track key's hour. */
export const at = (day: number, hour = 0) => day * 24 + hour

type PerDay = number | ((day: number) => number)
const valueOn = (v: PerDay, day: number) => (typeof v === 'function' ? v(day) : v)

/** Two keys a day from `from` to `to` (inclusive): a daily low and high, say. */
function twiceDaily(
  from: number,
  to: number,
  [h1, v1]: [number, PerDay],
  [h2, v2]: [number, PerDay],
): Track {
  const keys: [number, number][] = []
  for (let d = from; d <= to; d++)
    keys.push([at(d, h1), valueOn(v1, d)], [at(d, h2), valueOn(v2, d)])
  return keys.sort((a, b) => a[0] - b[0])
}

/** Keys for consecutive whole hours of day `day`, from `fromHour` on. */
function hourly(day: number, fromHour: number, values: number[]): Track {
  return values.map((v, i) => [at(day, fromHour + i), v])
}

/** One key per day at local noon: a daily mean series. */
function daily(points: [day: number, value: number][]): Track {
  return points.map(([d, v]) => [at(d, 12), v])
}

/** A track with each patch laid over it: inside a patch's span only the patch's keys count. */
function overlay(base: Track, ...patches: Track[]): Track {
  let keys = [...base]
  for (const patch of patches) {
    const lo = patch[0]![0]
    const hi = patch.at(-1)![0]
    keys = [...keys.filter(([h]) => h < lo || h > hi), ...patch]
  }
  return keys.sort((a, b) => a[0] - b[0])
}

const QUILLMERE = { lake: 'quillmere', timeZone: 'America/Chicago' } as const
/** Wind from the south-south-west crosses the longest open water of Quillmere (see the blow). */
const QUILLMERE_LONG_FETCH_FROM_DEG = 200

const defineScenarios = <K extends string>(s: Record<K, Omit<Scenario, 'name'>>) =>
  Object.fromEntries(Object.entries(s).map(([name, v]) => [name, { name, ...(v as object) }])) as {
    [N in K]: Scenario & { name: N }
  }

export const SCENARIOS = defineScenarios({
  blow: {
    summary:
      'A spring blow: 13 m/s (gusts 18) from the long-fetch direction through midday and the afternoon after a moderate dawn; the next midday hides two hours at 13 m/s in moderate wind.',
    ...QUILLMERE,
    day: '2026-04-14',
    clockHour: 5,
    backfillDays: 31,
    facts: {
      windFromDeg: QUILLMERE_LONG_FETCH_FROM_DEG,
      openWaterChordM: 6821,
      dawnWindMs: 6,
      blowWindMs: 13,
      blowGustMs: 18,
      hiddenPeakDay: 1,
    },
    water: {
      tempC: daily([
        [-45, 9.5],
        [-30, 11.5],
        [-14, 14.5],
        [-3, 16.8],
        [0, 17.2],
        [10, 18.5],
      ]),
      // The blow stirs the shallows: a little more colour the day after.
      turbidityFnu: [
        [at(-45), 6],
        [at(0, 10), 6.2],
        [at(1, 5), 10],
        [at(4), 7],
        [at(12), 6],
      ],
      levelFt: [
        [at(-45), 0.2],
        [at(12), 0.2],
      ],
    },
    weather: {
      windMs: overlay(
        twiceDaily(-2, 8, [6, 2.5], [15, 4.5]),
        // The blow day: dawn hours 06-09 moderate, 13 m/s from 10:00 to 19:00.
        [
          [at(-1, 18), 4],
          [at(0, 0), 5],
          ...hourly(0, 5, [6, 6, 6, 6.2, 6.5]),
          ...hourly(0, 10, [13, 13.2, 13.4, 13.5, 13.6, 13.4, 13.3, 13.2, 13.1, 13]),
          [at(0, 20), 10],
          [at(0, 22), 8],
          [at(1, 2), 6],
        ],
        // The next midday: two hours at 13 m/s inside 6 m/s.
        [[at(1, 5), 5], ...hourly(1, 10, [6, 6.5, 13, 13, 6.5, 6, 6]), [at(1, 19), 5]],
      ),
      gustMs: [
        [at(0, 9), 11],
        ...hourly(0, 10, [17.6, 18, 18.2, 18.4, 18.4, 18.2, 18, 18, 17.8, 17.6]),
        [at(0, 20), 14],
        [at(0, 22), 11.5],
        ...hourly(1, 11, [9.5, 18, 18, 9.5]),
      ],
      windFromDeg: [
        [at(-2), 170],
        [at(-1), 185],
        [at(-1, 18), QUILLMERE_LONG_FETCH_FROM_DEG],
        [at(1, 20), QUILLMERE_LONG_FETCH_FROM_DEG],
        [at(3), 250],
        [at(5), 200],
      ],
      airC: twiceDaily(-2, 8, [6, (d) => (d === 0 ? 15 : 12)], [15, (d) => (d === 0 ? 25 : 23)]),
      relativeHumidityPct: twiceDaily(-2, 8, [6, 85], [15, 50]),
      pressureHpa: [
        [at(-2), 1017],
        [at(-1), 1016],
        [at(0, 5), 1011],
        [at(0, 18), 1007],
        [at(1, 12), 1010],
        [at(2, 12), 1015],
        [at(8), 1016],
      ],
      cloudCoverPct: [
        [at(-2), 25],
        [at(0, 6), 40],
        [at(0, 17), 60],
        [at(1, 12), 50],
        [at(2, 12), 25],
      ],
      precipitationProbabilityPct: [
        [at(-2), 5],
        [at(0), 10],
        [at(2), 5],
      ],
    },
  },

  'storm-afternoon': {
    summary:
      'A hot, humid July day: a slight chance of thunder at dawn, 36 % and more from midday, the heat index peaking near 107 °F in the afternoon while the window averages near 99 °F.',
    ...QUILLMERE,
    day: '2026-07-16',
    clockHour: 5,
    backfillDays: 31,
    facts: {
      dawnThunderPct: 17,
      middayThunderPct: 45,
      afternoonThunderPct: 55,
      peakHeatAt: '18:00',
      peakAirC: 34.6,
      peakRelativeHumidityPct: 55,
    },
    water: {
      tempC: daily([
        [-45, 25],
        [-30, 26.5],
        [-14, 28],
        [0, 29],
        [10, 29.5],
      ]),
      turbidityFnu: [
        [at(-45), 5],
        [at(0, 19), 5],
        [at(1, 6), 8],
        [at(4), 5.5],
        [at(12), 5],
      ],
      levelFt: [
        [at(-45), 0.1],
        [at(12), -0.1],
      ],
    },
    weather: {
      airC: overlay(
        twiceDaily(-2, 8, [6, 24], [16, 33]),
        hourly(
          0,
          0,
          [
            27, 26.5, 26, 25.5, 25.2, 25, 25.2, 26, 27.5, 29, 30.5, 31.5, 32.3, 33, 33.5, 33.8, 34,
            34.2, 34.6, 31.3, 29.4, 28.5, 27.5, 27,
          ],
        ),
      ),
      relativeHumidityPct: overlay(
        twiceDaily(-2, 8, [6, 85], [16, 55]),
        hourly(
          0,
          0,
          [
            82, 84, 85, 86, 87, 88, 87, 84, 78, 72, 68, 64, 61, 59, 58, 57, 56, 55, 55, 64, 72, 78,
            80, 82,
          ],
        ),
      ),
      thunderProbabilityPct: overlay(
        twiceDaily(-2, 8, [6, 5], [17, 20]),
        hourly(
          0,
          0,
          [
            10, 10, 10, 12, 15, 16, 17, 17, 17, 36, 36, 38, 40, 40, 42, 45, 45, 45, 50, 55, 45, 30,
            20, 15,
          ],
        ),
      ),
      precipitationProbabilityPct: overlay(
        twiceDaily(-2, 8, [6, 10], [17, 25]),
        hourly(
          0,
          0,
          [
            15, 15, 15, 15, 20, 20, 20, 20, 20, 30, 40, 45, 45, 45, 50, 50, 50, 55, 60, 65, 55, 40,
            25, 20,
          ],
        ),
      ),
      precipitationMm: [[at(0, 18), 0], ...hourly(0, 19, [4, 6, 2]), [at(0, 22), 0]],
      cloudCoverPct: overlay(
        twiceDaily(-2, 8, [6, 20], [16, 45]),
        hourly(0, 6, [30, 30, 35, 40, 45, 50, 50, 55, 55, 60, 60, 65, 70, 90, 90, 70, 50]),
      ),
      // Light south-westerlies; the storm's outflow comes from the north-west.
      windMs: overlay(twiceDaily(-2, 8, [6, 1.5], [15, 3.5]), hourly(0, 17, [3.5, 4, 7, 5, 3])),
      gustMs: hourly(0, 18, [6, 14, 9]),
      windFromDeg: [
        [at(-2), 220],
        [at(0, 18), 220],
        [at(0, 19), 300],
        [at(0, 21), 300],
        [at(1, 6), 220],
        [at(8), 220],
      ],
      pressureHpa: [
        [at(-2), 1013],
        [at(0, 18), 1011.5],
        [at(0, 20), 1014],
        [at(1, 6), 1013],
        [at(8), 1014],
      ],
    },
  },

  'rain-event': {
    summary:
      'A May storm: 36 mm of rain the day before; turbidity steps from 3 to about 60 FNU between 30 and 6 hours before the morning, the level rises, and the water clears over the next days.',
    ...QUILLMERE,
    day: '2026-05-06',
    clockHour: 5,
    backfillDays: 31,
    facts: {
      rainDay: -1,
      rainTotalMm: 36,
      turbidityBeforeFnu: 3,
      turbidityAfterFnu: 60,
      stepFromHoursBeforeMorning: 30,
      stepToHoursBeforeMorning: 6,
      clearDay: 3,
    },
    water: {
      tempC: daily([
        [-45, 12],
        [-30, 14.5],
        [-14, 17.5],
        [-2, 19.8],
        [-1, 19.5],
        [0, 18.8],
        [3, 19.5],
        [10, 21],
      ]),
      turbidityFnu: [
        [at(-45), 3],
        [at(-2, 23), 3.1],
        [at(-1, 2), 3.2],
        [at(-1, 5), 15],
        [at(-1, 7), 40],
        [at(-1, 9), 58],
        [at(-1, 16), 61],
        [at(-1, 23), 61],
        [at(0, 5), 60],
        [at(0, 12), 57],
        [at(1, 5), 45],
        [at(2, 5), 30],
        [at(3, 5), 19],
        [at(4, 5), 12],
        [at(6, 5), 7],
        [at(9, 5), 4.5],
        [at(14), 3.5],
      ],
      levelFt: [
        [at(-45), 0],
        [at(-1, 3), 0],
        [at(-1, 12), 0.9],
        [at(0, 5), 1.6],
        [at(0, 18), 1.8],
        [at(3), 1.2],
        [at(6), 0.5],
        [at(10), 0.1],
        [at(14), 0],
      ],
    },
    weather: {
      precipitationMm: [[at(-1, 0), 0], ...hourly(-1, 1, [2, 2, 3, 5, 6, 6, 5, 4, 2, 1, 0])],
      precipitationProbabilityPct: [
        [at(-2), 20],
        [at(-2, 18), 60],
        [at(-1, 0), 100],
        [at(-1, 11), 100],
        [at(-1, 14), 30],
        [at(0), 5],
        [at(8), 5],
      ],
      thunderProbabilityPct: [[at(-1, 3), 0], ...hourly(-1, 4, [20, 20, 20, 20]), [at(-1, 8), 0]],
      cloudCoverPct: [
        [at(-2), 40],
        [at(-2, 20), 100],
        [at(-1, 14), 100],
        [at(-1, 20), 85],
        [at(0, 6), 60],
        [at(0, 16), 30],
        [at(2), 20],
        [at(8), 25],
      ],
      relativeHumidityPct: overlay(twiceDaily(-2, 8, [6, 85], [15, 50]), [
        [at(-2, 20), 80],
        [at(-1, 0), 95],
        [at(-1, 12), 95],
        [at(-1, 20), 88],
      ]),
      airC: overlay(twiceDaily(-2, 8, [6, 13], [15, 24]), [
        [at(-1, 0), 17],
        [at(-1, 12), 15],
        [at(-1, 16), 16],
        [at(0, 6), 12],
      ]),
      windMs: overlay(twiceDaily(-2, 8, [6, 2], [15, 4]), [
        [at(-2, 18), 4],
        [at(-1, 4), 6],
        [at(-1, 12), 5],
        [at(-1, 20), 3],
      ]),
      windFromDeg: [
        [at(-2), 160],
        [at(-1, 12), 180],
        [at(0, 6), 250],
        [at(3), 210],
      ],
      pressureHpa: [
        [at(-2), 1014],
        [at(-1, 4), 1006],
        [at(-1, 14), 1008],
        [at(0, 5), 1013],
        [at(1, 12), 1016],
        [at(8), 1016],
      ],
    },
  },

  'cold-front': {
    summary:
      'An October cold front the night before: pressure falls then rises more than 3 hPa in 3 h, the wind veers from south-west to north-west and picks up, the air 8 °C colder by morning.',
    ...QUILLMERE,
    day: '2026-10-21',
    clockHour: 5,
    backfillDays: 31,
    facts: {
      frontPassesAt: 'day -1 24:00',
      pressureFallHpa3h: -3.5,
      pressureRiseHpa3h: 7.5,
      windFromBeforeDeg: 225,
      windFromAfterDeg: 315,
      airBeforeC: 19.2,
      airMorningC: 11,
    },
    water: {
      tempC: daily([
        [-45, 26],
        [-30, 24],
        [-14, 21],
        [-1, 19.6],
        [0, 18.8],
        [3, 18.2],
        [10, 17],
      ]),
      turbidityFnu: [
        [at(-45), 7],
        [at(0), 7],
        [at(1), 8.5],
        [at(4), 7],
        [at(12), 7],
      ],
      levelFt: [
        [at(-45), -0.1],
        [at(12), -0.4],
      ],
    },
    weather: {
      pressureHpa: [
        [at(-3), 1019],
        [at(-1), 1016],
        [at(-1, 12), 1013],
        [at(-1, 18), 1009.5],
        [at(-1, 21), 1006],
        [at(0, 0), 1003.2],
        [at(0, 1), 1003.8],
        [at(0, 2), 1005.5],
        [at(0, 3), 1008],
        [at(0, 4), 1010.5],
        [at(0, 5), 1013],
        [at(0, 8), 1017],
        [at(0, 14), 1020.5],
        [at(1, 5), 1024],
        [at(3), 1022],
        [at(8), 1018],
      ],
      windFromDeg: [
        [at(-3), 190],
        [at(-1), 215],
        [at(-1, 18), 225],
        [at(-1, 23), 230],
        [at(0, 0), 250],
        [at(0, 1), 285],
        [at(0, 2), 310],
        [at(0, 5), 315],
        [at(0, 18), 320],
        [at(1, 12), 330],
        [at(2, 12), 280],
        [at(4), 210],
        [at(8), 200],
      ],
      windMs: overlay(twiceDaily(-3, 8, [6, 2.5], [15, 4.5]), [
        [at(-1, 12), 5],
        [at(-1, 20), 6],
        [at(0, 0), 7],
        [at(0, 2), 9],
        [at(0, 5), 9.5],
        [at(0, 10), 10],
        [at(0, 15), 9],
        [at(0, 19), 6],
        [at(1, 5), 3.5],
      ]),
      airC: overlay(
        twiceDaily(-3, 8, [6, (d) => (d <= 0 ? 12 : 7)], [15, (d) => (d < 0 ? 24 : 18)]),
        [
          [at(-1, 15), 23.5],
          [at(-1, 21), 20],
          [at(-1, 23), 19.2],
          [at(0, 0), 18],
          [at(0, 1), 15.5],
          [at(0, 2), 13.5],
          [at(0, 3), 12.5],
          [at(0, 5), 11],
          [at(0, 8), 11.5],
          [at(0, 15), 15.5],
          [at(0, 20), 10],
          [at(1, 6), 4],
          [at(1, 15), 16],
        ],
      ),
      relativeHumidityPct: overlay(twiceDaily(-3, 8, [6, 80], [15, 45]), [
        [at(-1, 15), 60],
        [at(-1, 21), 90],
        [at(0, 0), 95],
        [at(0, 2), 80],
        [at(0, 6), 60],
        [at(0, 15), 35],
        [at(1, 6), 70],
      ]),
      cloudCoverPct: [
        [at(-3), 25],
        [at(-1, 12), 40],
        [at(-1, 20), 90],
        [at(-1, 23), 100],
        [at(0, 1), 100],
        [at(0, 2), 60],
        [at(0, 4), 20],
        [at(0, 6), 5],
        [at(1, 18), 5],
        [at(3), 20],
        [at(8), 25],
      ],
      precipitationMm: [[at(-1, 21), 0], ...hourly(-1, 22, [1.5, 3, 2.5, 0.8, 0])],
      precipitationProbabilityPct: [
        [at(-3), 5],
        [at(-1, 12), 40],
        [at(-1, 22), 90],
        [at(0, 1), 90],
        [at(0, 3), 10],
        [at(0, 6), 0],
        [at(8), 5],
      ],
      thunderProbabilityPct: [[at(-1, 21), 0], ...hourly(-1, 22, [20, 25, 20, 10, 0])],
    },
  },

  'heat-wave': {
    summary:
      'An August heat wave: air 36-38 °C for days with the heat index over 103 °F, water near 30 °C, light wind and sun.',
    ...QUILLMERE,
    day: '2026-08-04',
    clockHour: 5,
    backfillDays: 31,
    facts: { airHighC: 37.5, afternoonRelativeHumidityPct: 42, waterC: 30.6 },
    water: {
      tempC: daily([
        [-45, 27],
        [-30, 28],
        [-10, 29.3],
        [-3, 30],
        [0, 30.6],
        [5, 31],
        [10, 30.5],
      ]),
      turbidityFnu: [
        [at(-45), 4],
        [at(12), 4],
      ],
      levelFt: [
        [at(-45), -0.4],
        [at(12), -0.6],
      ],
    },
    weather: {
      airC: twiceDaily(
        -4,
        8,
        [6, (d) => (d <= 4 ? 27 : 24)],
        [16, (d) => (d <= 4 ? [36.5, 37, 38, 37.5, 37.5, 37, 36.5, 36.5, 37][d + 4]! : 34)],
      ),
      relativeHumidityPct: twiceDaily(-4, 8, [6, 70], [16, 42]),
      windMs: twiceDaily(-4, 8, [6, 1.5], [15, 3]),
      cloudCoverPct: twiceDaily(-4, 8, [6, 10], [16, 15]),
      pressureHpa: [
        [at(-4), 1019],
        [at(8), 1018],
      ],
    },
  },

  'calm-sunny-prespawn': {
    summary:
      'Early March: water in the mid 40s °F and warming for two weeks, stained (20 FNU, Secchi about 0.5 m), calm and sunny with no thunder.',
    ...QUILLMERE,
    day: '2026-03-06',
    clockHour: 5,
    backfillDays: 31,
    facts: { waterC: 8, turbidityFnu: 20, secchiM: 0.5, maxWindMs: 1.8, cloudCoverPct: 8 },
    water: {
      tempC: daily([
        [-45, 6],
        [-30, 5.6],
        [-20, 5.8],
        [-14, 5.9],
        [-10, 6.4],
        [-7, 7],
        [-3, 7.6],
        [0, 8],
        [4, 8.5],
        [10, 9.3],
      ]),
      turbidityFnu: [
        [at(-45), 24],
        [at(-14), 21],
        [at(0), 20],
        [at(12), 18],
      ],
      levelFt: [
        [at(-45), 0.3],
        [at(12), 0.3],
      ],
    },
    weather: {
      windMs: twiceDaily(-3, 8, [6, 0.8], [15, 1.8]),
      gustMs: twiceDaily(-3, 8, [6, 1.5], [15, 2.8]),
      windFromDeg: [
        [at(-3), 180],
        [at(8), 200],
      ],
      airC: twiceDaily(-3, 8, [6, 2], [15, 17]),
      relativeHumidityPct: twiceDaily(-3, 8, [6, 85], [15, 35]),
      cloudCoverPct: overlay(twiceDaily(-3, 8, [6, 15], [15, 15]), [
        [at(-1, 12), 10],
        [at(0), 8],
        [at(0, 23), 8],
        [at(1, 12), 10],
      ]),
      pressureHpa: [
        [at(-3), 1027],
        [at(8), 1026],
      ],
    },
  },

  'early-winter-warm-spell': {
    summary:
      'Early December after a cooling fall: a week of warm days, the water at 12-14 °C and warming a little over the last days. Not a pre-spawn.',
    ...QUILLMERE,
    day: '2026-12-08',
    clockHour: 5,
    backfillDays: 31,
    facts: { waterC: 13.1, warmSpellFromDay: -7, airHighC: 21 },
    water: {
      tempC: daily([
        [-45, 19],
        [-30, 16.8],
        [-20, 14.8],
        [-12, 12.9],
        [-7, 12.1],
        [-4, 12.4],
        [-1, 12.9],
        [0, 13.1],
        [3, 13.2],
        [6, 12.8],
        [10, 12],
      ]),
      turbidityFnu: [
        [at(-45), 6],
        [at(12), 6],
      ],
      levelFt: [
        [at(-45), -0.8],
        [at(12), -1],
      ],
    },
    weather: {
      airC: twiceDaily(-7, 8, [7, (d) => (d <= 2 ? 11 : 3)], [15, (d) => (d <= 2 ? 21 : 12)]),
      relativeHumidityPct: twiceDaily(-7, 8, [7, 85], [15, 50]),
      windMs: twiceDaily(-7, 8, [7, 2], [15, 4]),
      windFromDeg: [
        [at(-7), 190],
        [at(2), 200],
        [at(3, 12), 330],
        [at(8), 320],
      ],
      cloudCoverPct: twiceDaily(-7, 8, [7, 30], [15, 35]),
      pressureHpa: [
        [at(-7), 1021],
        [at(2), 1018],
        [at(3, 12), 1026],
        [at(8), 1024],
      ],
    },
  },
})

export type ScenarioName = keyof typeof SCENARIOS
export const SCENARIO_NAMES = Object.keys(SCENARIOS) as ScenarioName[]

export function isScenarioName(name: unknown): name is ScenarioName {
  return typeof name === 'string' && Object.hasOwn(SCENARIOS, name)
}

/** The instant a test sets its clock to: `clockHour` local on the scenario's day (or `day`). */
export function scenarioClock(scenario: Scenario, day = scenario.day): Date {
  return new Date(zonedMidnight(day, scenario.timeZone).getTime() + scenario.clockHour * HOUR_MS)
}

/** A track with its keys turned into instants, for lookups by time. */
class Series {
  private readonly times: number[]
  private readonly values: number[]
  constructor(
    keys: Track,
    toInstant: (hour: number) => number,
    private readonly circular = false,
  ) {
    const sorted = [...keys].sort((a, b) => a[0] - b[0])
    this.times = sorted.map(([h]) => toInstant(h))
    this.values = sorted.map(([, v]) => v)
  }

  get first() {
    return this.times[0] ?? Infinity
  }
  get last() {
    return this.times.at(-1) ?? -Infinity
  }

  /** The value at t, or undefined outside the keys. */
  at(t: number): number | undefined {
    const { times, values } = this
    if (!times.length || t < times[0]! || t > times.at(-1)!) return undefined
    let lo = 0
    let hi = times.length - 1
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1
      if (times[mid]! <= t) lo = mid
      else hi = mid
    }
    const span = times[hi]! - times[lo]!
    const f = span > 0 ? (t - times[lo]!) / span : 0
    const a = values[lo]!
    let b = values[hi]!
    // Directions turn the short way round: 350° to 10° passes north.
    if (this.circular) b = a + ((((b - a) % 360) + 540) % 360) - 180
    const v = a + f * (b - a)
    return this.circular ? ((v % 360) + 360) % 360 : v
  }
}

/** Quiet weather inside the scripted hours where a scenario gives no track. */
const WEATHER_DEFAULTS: Omit<WeatherSample, 'windMs' | 'airC' | 'gustMs'> = {
  windFromDeg: 200,
  relativeHumidityPct: 60,
  pressureHpa: 1016,
  precipitationMm: 0,
  cloudCoverPct: 20,
  precipitationProbabilityPct: 0,
  thunderProbabilityPct: 0,
}

/** A scenario placed on the calendar: what the model asks for each instant it overrides. */
export class ScriptedDays {
  readonly day: string
  private readonly water: Record<keyof ScenarioWater, Series>
  private readonly weatherTracks: Partial<Record<keyof WeatherSample, Series>>
  private readonly weatherFrom: number
  private readonly weatherTo: number

  constructor(
    readonly scenario: Scenario,
    day = scenario.day,
  ) {
    this.day = day
    const toInstant = (hour: number) => {
      const d = Math.floor(hour / 24)
      return zonedMidnight(addDays(day, d), scenario.timeZone).getTime() + (hour - d * 24) * HOUR_MS
    }
    const w = scenario.water
    this.water = {
      tempC: new Series(w.tempC, toInstant),
      turbidityFnu: new Series(w.turbidityFnu, toInstant),
      levelFt: new Series(w.levelFt, toInstant),
    }
    this.weatherTracks = Object.fromEntries(
      Object.entries(scenario.weather).map(([k, keys]) => [
        k,
        new Series(keys, toInstant, k === 'windFromDeg'),
      ]),
    )
    const wind = this.weatherTracks.windMs!
    const air = this.weatherTracks.airC!
    this.weatherFrom = Math.max(wind.first, air.first)
    this.weatherTo = Math.min(wind.last, air.last)
  }

  /** When a test's clock is set for this placement of the scenario. */
  get clock(): Date {
    return scenarioClock(this.scenario, this.day)
  }

  waterAt(kind: keyof ScenarioWater, t: number): number | undefined {
    return this.water[kind].at(t)
  }

  /** Whether the weather at t is scripted (then forecasts of it do not drift). */
  scriptsWeather(t: number): boolean {
    return t >= this.weatherFrom && t <= this.weatherTo
  }

  weatherAt(t: number): WeatherSample | undefined {
    if (!this.scriptsWeather(t)) return undefined
    const track = (k: keyof WeatherSample) => this.weatherTracks[k]?.at(t)
    const windMs = track('windMs')!
    const sample = { windMs, airC: track('airC')!, gustMs: track('gustMs') ?? windMs * 1.4 + 0.5 }
    const rest = Object.fromEntries(
      Object.entries(WEATHER_DEFAULTS).map(([k, v]) => [k, track(k as keyof WeatherSample) ?? v]),
    ) as typeof WEATHER_DEFAULTS
    // A gust is never below the mean wind.
    return { ...rest, ...sample, gustMs: Math.max(sample.gustMs, windMs) }
  }
}
