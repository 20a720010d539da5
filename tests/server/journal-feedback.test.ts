import { eq } from 'drizzle-orm'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import type { LakeDay } from '../../shared/conditions/day-plan'
import { makeFormat } from '../../shared/format'
import { LOG_MIN_SIMILAR, logLine } from '../../shared/journal/feedback'
import { DayPlanResponse } from '../../shared/schemas/day-plan'
import type { CatchConditions } from '../../shared/schemas/journal'
import { watchChanges, type Changes } from '../../server/db/changes'
import { catches, users } from '../../server/db/schema/index'
import { composeBrief, renderBrief } from '../../server/features/brief/compose'
import { conditionsAnswers } from '../../server/features/conditions/conditions.cache'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { logCatches } from '../../server/features/journal/your-log'
import { createUser } from '../helpers/app'
import { startScenario, type ScenarioWorld } from '../helpers/scenario'

/**
 * The angler's own log fed back into the day: with enough catches in the day's clarity, water band
 * and phase, the Day plan (on every instance, kept answers and all) and the brief add a line beside
 * the tackle calls; with too few, the rules' plan is left exactly as it was.
 */
let w: ScenarioWorld
let one: Changes
let two: Changes
let today: string

beforeAll(async () => {
  // A calm, sunny pre-spawn morning: every window is fishable and the rules call several families.
  w = await startScenario('calm-sunny-prespawn')
  today = w.date
  one = watchChanges(w.db.$client.options, pino({ level: 'silent' }), 50)
  two = watchChanges(w.db.$client.options, pino({ level: 'silent' }), 50)
  await vi.waitFor(() => expect(one.live && two.live).toBe(true))
})
afterAll(async () => {
  await one.close()
  await two.close()
  await w.feed.close()
  await w.drop()
})

async function anAngler(email: string) {
  await createUser(w.db, email)
  const [user] = await w.db.select().from(users).where(eq(users.email, email))
  return user!.id
}

async function storedDay(): Promise<LakeDay> {
  return (await w.lakeDay(0))!
}

/** Catches stored as the journal stores them, in the conditions given. */
async function logFish(
  userId: string,
  n: number,
  day: Pick<LakeDay, 'clarity' | 'phase' | 'waterC'>,
  lure: { family: string; blade?: 'colorado' | null },
  timeOfDay: CatchConditions['timeOfDay'] = 'dawn',
) {
  const conditions: CatchConditions = {
    waterC: day.waterC,
    clarity: { class: day.clarity, secchiM: 0.8, trend: 'steady' },
    phase: day.phase,
    wind: null,
    bankExposure: null,
    sky: 'partly',
    cloudCoverPct: 40,
    airC: 15,
    pressure: null,
    verdict: 'go',
    timeOfDay,
    localDate: today,
    computedAt: new Date().toISOString(),
  }
  await w.db.insert(catches).values(
    Array.from({ length: n }, () => ({
      userId,
      lakeId: w.lake.id,
      caughtAt: new Date(w.feed.now().getTime() - 86_400_000),
      species: 'largemouth' as const,
      lengthM: 0.4,
      released: true,
      lure: {
        family: lure.family,
        blade: lure.blade ?? null,
        color: '',
        size: '',
        trailer: '',
        trailerHook: null,
        retrieve: '',
      },
      conditions,
    })),
  )
}

describe('the log fed back into the day', () => {
  it(`adds nothing below ${LOG_MIN_SIMILAR} similar catches, then a line that follows every new catch`, async () => {
    const id = await anAngler('feedback@journal.test')
    // Two instances keeping plans in memory; catches go straight into the database, as the
    // journal's routes, an import or another instance would write them.
    const services = [one, two].map((c) => conditionsAnswers(conditionsFor(w.db), c))
    const plan = async (i = 1) =>
      DayPlanResponse.parse(
        JSON.parse(
          (await services[i]!.plan(id, 'quillmere', today, w.feed.now())).answer.body.toString(),
        ),
      ).plan!
    const day = await storedDay()
    const rules = await plan()
    await plan(0)
    const fishable = rules.windows.filter((x) => x.tackle.length > 1)
    expect(fishable.length).toBeGreaterThan(0)
    expect(rules.windows.every((x) => x.yourLog === null)).toBe(true)

    // The family the rules call last in the first window: the log will move it first.
    const last = fishable[0]!.tackle.at(-1)!.family
    await logFish(id, 3, day, { family: last, blade: 'colorado' })
    // Other conditions never count: another clarity and phase.
    await logFish(
      id,
      6,
      {
        ...day,
        clarity: day.clarity === 'muddy' ? 'clear' : 'muddy',
        phase: day.phase === 'summer' ? 'winter' : 'summer',
      },
      { family: 'jig' },
    )
    // Still nothing at 3 similar catches, and the calls in the rules' order.
    await expect
      .poll(async () => (await plan()).windows.map((x) => x.yourLog))
      .toEqual(rules.windows.map(() => null))
    expect((await plan()).windows.map((x) => x.tackle)).toEqual(rules.windows.map((x) => x.tackle))

    await logFish(id, 2, day, { family: last, blade: 'colorado' }, 'afternoon')
    await logFish(id, 1, day, { family: 'Topwater' }, 'midday')
    for (const i of [0, 1])
      await expect
        .poll(async () => (await plan(i)).windows.find((x) => x.id === fishable[0]!.id)!.yourLog)
        .toMatchObject({
          count: 5,
          of: 6,
          familyCount: 5,
          family: last,
          blade: 'colorado',
          clarity: day.clarity,
          phase: day.phase,
          leads: true,
        })
    const withLog = await plan()
    for (const x of withLog.windows.filter((v) => v.tackle.length)) {
      expect(x.tackle[0]!.family).toBe(last)
      expect(x.tackle.map((t) => t.family).sort()).toEqual(
        rules.windows
          .find((r) => r.id === x.id)!
          .tackle.map((t) => t.family)
          .sort(),
      )
      expect(logLine(x.yourLog!, makeFormat())).toMatch(
        /^Your log: 5 of 6 fish in .+ water (under|at) .+ °F in the .+ phase came on an? .+ with a Colorado blade\.$/,
      )
    }

    // Catches deleted below the threshold take the line away and the rules' order back.
    await w.db.delete(catches).where(eq(catches.userId, id))
    await expect
      .poll(async () => (await plan()).windows.map((x) => x.tackle))
      .toEqual(rules.windows.map((x) => x.tackle))
    expect((await plan()).windows.every((x) => x.yourLog === null)).toBe(true)
  })

  it("writes the line into the brief in the reader's units, and leaves a thin log out", async () => {
    const id = await anAngler('brief-log@journal.test')
    const day = {
      ...(await storedDay()),
      clarity: 'stained' as const,
      waterC: 12,
      phase: 'pre-spawn' as const,
    }
    await logFish(id, 7, day, { family: 'spinnerbait', blade: 'colorado' })
    await logFish(id, 2, day, { family: 'jig' })
    const log = (await logCatches(w.db, [id])).get(id)!
    expect(log).toHaveLength(9)
    const brief = (units: 'imperial' | 'metric', withLog = log) =>
      renderBrief(
        composeBrief({
          date: today,
          units:
            units === 'imperial'
              ? { temperature: 'F', length: 'ft', speed: 'mph', clock: '12h' }
              : { temperature: 'C', length: 'm', speed: 'kmh', clock: '24h' },
          origin: 'https://chopline.test',
          unsubscribeUrl: 'https://chopline.test/unsubscribe',
          log: withLog,
          lakes: [
            {
              slug: 'quillmere',
              name: 'Quillmere',
              timeZone: 'America/Chicago',
              read: null,
              day,
              banks: [],
            },
          ],
        }),
      )
    expect(brief('imperial').text).toContain(
      'Your log: 7 of 9 fish in stained water at 50-59 °F in the pre-spawn phase came on a spinnerbait with a Colorado blade.',
    )
    expect(brief('metric').text).toContain('in stained water at 10-15 °C in the pre-spawn phase')
    expect(brief('metric').html).toContain('Your log: 7 of 9 fish')
    expect(brief('imperial', log.slice(0, LOG_MIN_SIMILAR - 1)).text).not.toContain('Your log')
  })
})
