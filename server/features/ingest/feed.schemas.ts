import { z } from 'zod'

/** The feed is untrusted: every document and every row is parsed before use. */
const Id = z.union([z.string().min(1).max(200), z.number().int()]).transform(String)

const Datastream = z.object({
  '@iot.id': Id,
  unitOfMeasurement: z.object({ symbol: z.string().min(1).max(20) }),
  ObservedProperty: z.object({ '@iot.id': Id }),
})

/** Things with their Datastreams expanded inline ($expand=Datastreams($expand=ObservedProperty)). */
export const ThingList = z.object({
  value: z.array(
    z.object({ '@iot.id': Id, name: z.string(), Datastreams: z.array(Datastream).optional() }),
  ),
})

export const ObservationPage = z.object({
  value: z.array(z.unknown()),
  '@iot.nextLink': z.url().optional(),
})

/** A Thing's Datastreams with their first page of Observations inline ($expand=Observations(...)). */
export const StationObservations = z.object({
  value: z.array(
    z.object({
      '@iot.id': Id,
      Observations: z.array(z.unknown()).optional(),
      'Observations@iot.nextLink': z.url().optional(),
    }),
  ),
})

export const Observation = z.object({
  '@iot.id': Id,
  phenomenonTime: z.iso.datetime({ offset: true }),
  result: z.number().refine(Number.isFinite, 'result must be a finite number'),
})
export type Observation = z.infer<typeof Observation>

const Pct = z.number().min(0).max(100)

/** Ranges here are the weather side's plausibility rules (°C, m/s, hPa as the feed declares). */
export const WeatherHour = z.object({
  time: z.iso.datetime({ offset: true }),
  windSpeed: z.number().min(0).max(75),
  windGust: z.number().min(0).max(100),
  windFrom: z.number().min(0).max(360),
  airTemperature: z.number().min(-60).max(60),
  relativeHumidity: Pct,
  pressure: z.number().min(870).max(1085),
  precipitation: z.number().min(0).max(300),
  cloudCover: Pct,
  precipitationProbability: Pct.optional(),
  thunderProbability: Pct.optional(),
})
export type WeatherHour = z.infer<typeof WeatherHour>

export const WeatherDocument = z.object({
  issuedAt: z.iso.datetime({ offset: true }).optional(),
  units: z.object({
    windSpeed: z.literal('m/s'),
    windGust: z.literal('m/s'),
    airTemperature: z.literal('°C'),
    pressure: z.literal('hPa'),
  }),
  hours: z.array(z.unknown()),
})
