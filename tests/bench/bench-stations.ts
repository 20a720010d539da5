import type { FeedStation } from '../../server/fakes/feed/index'

export const BENCH_PARAMS = ['water_temp', 'gauge_height', 'turbidity', 'dissolved_oxygen'] as const
export const BENCH_UNITS = {
  water_temp: '°C',
  gauge_height: 'ft',
  turbidity: 'FNU',
  dissolved_oxygen: 'mg/L',
} as const
export const BENCH_NOW = new Date('2026-06-15T12:00:00Z')

/** 500 stations on five synthetic lakes, so stations differ in climate. */
export function benchStations(count: number): FeedStation[] {
  return Array.from({ length: count }, (_, i) => ({
    thingId: 1000 + i,
    name: `Bench gauge ${i}`,
    lake: {
      slug: `bench-${i % 5}`,
      lat: 30 + (i % 5) * 3,
      lon: -90 + (i % 5),
      normalGaugeFt: 10,
      baseTurbidityFnu: 5,
    },
    datastreams: BENCH_PARAMS.map((parameter) => ({ parameter, unit: BENCH_UNITS[parameter] })),
  }))
}
