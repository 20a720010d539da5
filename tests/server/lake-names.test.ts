import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DeskLake } from '../../shared/schemas/desk'
import { LakeNames, LakePage } from '../../shared/schemas/lakes'
import { lakes } from '../../server/db/schema/index'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'

let ctx: Awaited<ReturnType<typeof createTestDb>>
const square = {
  type: 'Polygon' as const,
  coordinates: [
    [
      [-90, 35],
      [-89.99, 35],
      [-89.99, 35.01],
      [-90, 35],
    ] as [number, number][],
  ],
}

beforeAll(async () => {
  ctx = await createTestDb()
  // 120 lakes, named so the last in name order is past the paged list's cap of 100.
  await ctx.db.insert(lakes).values(
    Array.from({ length: 120 }, (_, i) => ({
      slug: `pond-${String(i + 1).padStart(3, '0')}`,
      name: `Pond ${String(i + 1).padStart(3, '0')}`,
      region: 'Test County',
      timeZone: 'America/Chicago',
      normalPoolM: 100 + i,
      shoreline: square,
      areaKm2: 0.5,
      centerLon: -89.995,
      centerLat: 35.005,
    })),
  )
})
afterAll(() => ctx.drop())

describe('the lake picker', () => {
  it('lists every lake by name, past the paged list’s cap of 100', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'names@lakes.test')
    const paged = LakePage.parse(
      (await angler.get('/api/lakes').query({ pageSize: 100 }).expect(200)).body,
    )
    expect(paged.items.map((l) => l.slug)).not.toContain('pond-101')

    const names = LakeNames.parse((await angler.get('/api/lakes/names').expect(200)).body)
    expect(names.items).toHaveLength(120)
    expect(names.items[100]).toEqual({ slug: 'pond-101', name: 'Pond 101' })
    expect(names.items.at(-1)).toEqual({ slug: 'pond-120', name: 'Pond 120' })
    // Names and slugs only: nothing a picker does not show.
    expect(Object.keys(names.items[0]!).sort()).toEqual(['name', 'slug'])
  })

  it('gives the desk the 101st lake to edit', async () => {
    const app = testApp(ctx.db)
    const admin = await signedInAgent(app, ctx.db, 'names-admin@lakes.test', 'admin')
    const lake = DeskLake.parse((await admin.get('/api/admin/lakes/pond-101').expect(200)).body)
    expect(lake).toEqual({
      slug: 'pond-101',
      name: 'Pond 101',
      region: 'Test County',
      timeZone: 'America/Chicago',
      normalPoolM: 200,
    })
    const missing = await admin.get('/api/admin/lakes/no-such-lake').expect(404)
    expect(missing.body.error).toEqual({ code: 'not_found', message: 'No such lake.' })
  })
})
