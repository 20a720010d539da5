import type { FeedStation } from '../../fakes/feed/index'
import { DEMO_LAKES } from './demo-lakes'

/** One gauge per demo lake, in the units an agency would publish; Quillmere adds a Secchi disk, Tanglewhit an oxygen probe. */
export const DEMO_STATIONS: FeedStation[] = DEMO_LAKES.map((shape, i) => ({
  thingId: 100 + i,
  name: `${shape.name} dam gauge`,
  lake: {
    slug: shape.slug,
    lon: shape.center[0],
    lat: shape.center[1],
    normalGaugeFt: 12 + 3 * i,
    baseTurbidityFnu: [4, 9, 2.5][i] ?? 5,
  },
  datastreams: [
    { parameter: 'water_temp', unit: '°C' },
    { parameter: 'gauge_height', unit: i === 1 ? 'm' : 'ft' },
    { parameter: 'turbidity', unit: i === 1 ? 'NTU' : 'FNU' },
    ...(i === 0 ? [{ parameter: 'secchi' as const, unit: 'm' }] : []),
    ...(i === 2 ? [{ parameter: 'dissolved_oxygen' as const, unit: 'mg/L' }] : []),
  ],
}))

export const DEMO_FEED_SEED = 20261201
